import { describe, expect, it } from 'vitest';
import { Member } from '../../../src/lib/server/db/models';
import { formValuesOf } from '../../../src/lib/intake/formValues';
import { memberSchema } from '../../../src/lib/intake/schemas';
import { asDemoSurveyor, auditOf } from '../../helpers/editing';
import { freshSurvey } from '../../helpers/intake';

// EN 1992-1-1 §4.4.1.1, Eq. (4.1): c_nom = c_min + Δc_dev; c_nom below it is refused (400 naming
// cNomMm) through the API, whatever the route, and nothing is written.
const SHORTFALL = 'c_nom 40 mm is below c_min + Δc_dev = 45 mm (EN 1992-1-1 (4.1)).';

describe('c_nom checked against c_min + Δc_dev through the API (the built app, the real database)', () => {
	const session = asDemoSurveyor();

	it('PUT /api/v1/members/{id} answers 400 naming cNomMm with the figure expected; the member is as it was', async () => {
		const { members } = await freshSurvey(session.actor, ['S-01']);
		const before = members[0].get({ plain: true });
		const body = {
			...formValuesOf(before, memberSchema),
			exposureClass: 'XD1',
			cMinMm: 35,
			cNomMm: 40,
			deltaCDevMm: 10
		};
		const response = await session.surveyor.putJson(`/api/v1/members/${members[0].id}`, body);
		expect(response.status).toBe(400);
		expect((await response.json()).error).toEqual({
			code: 'invalid_input',
			message: SHORTFALL,
			field: 'cNomMm'
		});
		const after = (await members[0].reload()).get({ plain: true });
		expect([after.exposureClass, after.cMinMm, after.cNomMm]).toEqual(['XC3', 25, 35]);
		expect(await auditOf('member.updated', 'member', members[0].id)).toEqual([]);
	});

	it('the same PUT with c_nom above c_min + Δc_dev is saved (a project may specify more)', async () => {
		const { members } = await freshSurvey(session.actor, ['S-01']);
		const body = { ...formValuesOf(members[0].get({ plain: true }), memberSchema), cNomMm: 50 };
		const response = await session.surveyor.putJson(`/api/v1/members/${members[0].id}`, body);
		expect(response.status, await response.clone().text()).toBe(200);
		expect((await members[0].reload()).cNomMm).toBe(50);
	});

	it('POST …/members/bulk with one short row answers 400 naming the row and cNomMm; no member is created', async () => {
		const { survey } = await freshSurvey(session.actor, ['S-01']);
		const table = [
			'label\ttype\tface\texposure\tc_min\tc_nom\tdelta c_dev',
			'S-02\tbeam\tside\tXD1\t35\t45\t10',
			'S-03\tbeam\tside\tXD1\t35\t40\t10'
		].join('\n');
		const response = await session.surveyor.postJson(`/api/v1/surveys/${survey.id}/members/bulk`, {
			table
		});
		expect(response.status).toBe(400);
		const { error } = await response.json();
		expect(error.code).toBe('invalid_input');
		expect(error.field).toBe('table');
		expect(error.message).toContain(`Row 3: cNomMm: ${SHORTFALL}`);
		expect(error.message).not.toContain('Row 2');
		const labels = (await Member.findAll({ where: { surveyId: survey.id } })).map((m) => m.label);
		expect(labels).toEqual(['S-01']);
	});

	it('POST …/members answers 400 naming cNomMm for c_nom below c_min, and creates nothing', async () => {
		const { survey, members } = await freshSurvey(session.actor, ['S-01']);
		const body = {
			...formValuesOf(members[0].get({ plain: true }), memberSchema),
			label: 'S-02',
			cNomMm: 20
		};
		const response = await session.surveyor.postJson(`/api/v1/surveys/${survey.id}/members`, body);
		expect(response.status).toBe(400);
		const { error } = await response.json();
		expect(error.field).toBe('cNomMm');
		expect(error.message).toBe(
			'c_nom 20 mm is below c_min 25 mm: the nominal cover cannot be less than the minimum (EN 1992-1-1 4.4.1).'
		);
		expect(await Member.count({ where: { surveyId: survey.id } })).toBe(1);
	});

	it('GET /api/v1/requirements takes a typed Δc_dev (XD1, S4: c_nom = 35 + 5 mm) and refuses one over 10 mm naming it', async () => {
		const query = 'exposureClass=XD1&barDiameterMm=16&structuralClass=S4';
		const typed = await session.surveyor.get(`/api/v1/requirements?${query}&deltaCDevMm=5`);
		// EN 1992-1-1 Table 4.4N, S4, XD1: c_min,dur 35 mm; (4.1) with Δc_dev 5 mm: c_nom 40 mm.
		expect((await typed.json()).suggestion).toMatchObject({
			cMinMm: 35,
			cNomMm: 40,
			deltaCDevMm: 5
		});
		const tooMuch = await session.surveyor.get(`/api/v1/requirements?${query}&deltaCDevMm=12`);
		expect(tooMuch.status).toBe(400);
		// EN 1992-1-1 4.4.1.3: Δc_dev 10 mm recommended, reduced down to 0 mm; never more.
		expect((await tooMuch.json()).error).toMatchObject({
			field: 'deltaCDevMm',
			message: 'EN 1992-1-1 4.4.1.3 takes Δc_dev from 0 to 10 mm.'
		});
	});
});
