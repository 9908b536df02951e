/**
 * Carbonation tests and chloride profiles of a member, over HTTP against the built app and the
 * real database: validated with the field or increment named, audited, frozen with their survey,
 * kept as read, contents of concrete converted to % of binder with the values assumed.
 */
import { describe, expect, it } from 'vitest';
import { CarbonationTest, ChlorideIncrement } from '../../../src/lib/server/db/models';
import {
	asDemoSurveyor,
	auditOf,
	editableRecords,
	foreignRecords,
	submitSurvey
} from '../../helpers/editing';
import { signInAs } from '../../helpers/session';

const TEST = {
	label: 'CT1',
	xMm: 900,
	yMm: 250,
	testedOn: '2026-02-10',
	depthsMm: [8, 11, 9.5, 12],
	method: 'Phenolphthalein on a freshly split core'
};
const PROFILE = {
	label: 'CP1',
	testedOn: '2026-02-10',
	basis: 'concrete',
	binderContentKgM3: 340,
	concreteDensityKgM3: 2350,
	increments: [
		{ fromMm: 0, toMm: 5, chloridePercent: 0.42 },
		{ fromMm: 5, toMm: 10, chloridePercent: 0.36 },
		{ fromMm: 10, toMm: 20, chloridePercent: 0.22 }
	]
};

describe('durability measurements of a member (the built app, the real database)', () => {
	const session = asDemoSurveyor();

	it('records a carbonation test as read, lists it, audits it and removes it', async () => {
		const { member } = await editableRecords(session.actor);
		const base = `/api/v1/members/${member.id}/carbonation-tests`;
		const created = await session.surveyor.postJson(base, TEST);
		expect(created.status).toBe(201);
		const { carbonationTest } = await created.json();
		expect(carbonationTest).toMatchObject({ ...TEST, depthMeanMm: null, memberId: member.id });
		const listed = await (await session.surveyor.get(base)).json();
		expect(listed.carbonationTests.map((t: { label: string }) => t.label)).toEqual(['CT1']);
		const [event] = await auditOf('carbonation_test.created', 'member', member.id);
		expect(event.detail).toMatchObject({ label: 'CT1', depthsMm: [8, 11, 9.5, 12] });
		const removed = await session.surveyor.delete(
			`/api/v1/carbonation-tests/${carbonationTest.id}`
		);
		expect(removed.status).toBe(204);
		expect(await CarbonationTest.count({ where: { memberId: member.id } })).toBe(0);
		expect(await auditOf('carbonation_test.deleted', 'member', member.id)).toHaveLength(1);
	});

	it('answers inconsistent depths, no depth at all and a taken label 400 naming the field', async () => {
		const { member } = await editableRecords(session.actor);
		const base = `/api/v1/members/${member.id}/carbonation-tests`;
		const cases: [Record<string, unknown>, string, RegExp][] = [
			[
				{ ...TEST, depthMinMm: 12, depthMaxMm: 9 },
				'depthMeanMm',
				/minimum depth is more than the maximum/
			],
			[{ ...TEST, depthsMm: [], depthMeanMm: null }, 'depthsMm', /depth readings, or the mean/],
			[{ ...TEST, depthMaxMm: 10 }, 'depthsMm', /11 mm lies outside/],
			[{ ...TEST, testedOn: '10/02/2026' }, 'testedOn', /YYYY-MM-DD/]
		];
		for (const [body, field, message] of cases) {
			const response = await session.surveyor.postJson(base, body);
			expect(response.status, field).toBe(400);
			const { error } = await response.json();
			expect(error.field).toBe(field);
			expect(error.message).toMatch(message);
		}
		expect((await session.surveyor.postJson(base, TEST)).status).toBe(201);
		const clash = await session.surveyor.postJson(base, { ...TEST, label: 'ct1' });
		expect(clash.status).toBe(400);
		expect((await clash.json()).error).toMatchObject({ field: 'label' });
		expect(await CarbonationTest.count({ where: { memberId: member.id } })).toBe(1);
	});

	it('records a chloride profile with its increments, the outermost flagged, converted to % of binder', async () => {
		const { member } = await editableRecords(session.actor);
		const created = await session.surveyor.postJson(
			`/api/v1/members/${member.id}/chloride-profiles`,
			PROFILE
		);
		expect(created.status).toBe(201);
		const { chlorideProfile } = await created.json();
		expect(chlorideProfile.increments.map((i: { outermost: boolean }) => i.outermost)).toEqual([
			true,
			false,
			false
		]);
		// Worked by hand: 0.42 % of concrete × 2350 kg/m³ ÷ 340 kg/m³ binder = 2.90294… % of binder.
		expect(chlorideProfile.increments[0].percentOfBinder).toBeCloseTo(2.902941, 5);
		expect(chlorideProfile.increments[0].chloridePercent).toBe(0.42);
		expect(chlorideProfile.conversion).toContain('340 kg/m³ (assumed binder content)');
		const read = await session.surveyor.get(`/api/v1/chloride-profiles/${chlorideProfile.id}`);
		expect((await read.json()).chlorideProfile).toEqual(chlorideProfile);
		const [event] = await auditOf('chloride_profile.created', 'member', member.id);
		expect(event.detail).toMatchObject({
			label: 'CP1',
			increments: [
				[0, 5, 0.42],
				[5, 10, 0.36],
				[10, 20, 0.22]
			]
		});
		expect(
			(await session.surveyor.delete(`/api/v1/chloride-profiles/${chlorideProfile.id}`)).status
		).toBe(204);
		expect(await ChlorideIncrement.count({ where: { profileId: chlorideProfile.id } })).toBe(0);
	});

	it('names the increment at fault, and asks for the conversion values of contents of concrete', async () => {
		const { member } = await editableRecords(session.actor);
		const base = `/api/v1/members/${member.id}/chloride-profiles`;
		const overlapping = [...PROFILE.increments, { fromMm: 15, toMm: 25, chloridePercent: 0.1 }];
		const cases: [Record<string, unknown>, string, RegExp][] = [
			[
				{ ...PROFILE, increments: overlapping },
				'increments',
				/^Increment 4 \(15–25 mm\): overlaps/
			],
			[
				{ ...PROFILE, increments: [{ fromMm: 5, toMm: 5, chloridePercent: 0.3 }] },
				'increments',
				/^Increment 1 .*deeper than the from-depth/
			],
			[
				{ ...PROFILE, binderContentKgM3: null },
				'binderContentKgM3',
				/binder content and concrete density/
			],
			[{ ...PROFILE, basis: 'cement paste' }, 'basis', /binder or of concrete/]
		];
		for (const [body, field, message] of cases) {
			const response = await session.surveyor.postJson(base, body);
			expect(response.status, field).toBe(400);
			const { error } = await response.json();
			expect([error.field, error.message]).toEqual([field, expect.stringMatching(message)]);
		}
	});

	it('takes the form on the survey’s measurements page, increments one a line, and names a bad line', async () => {
		const { survey, member } = await editableRecords(session.actor);
		const page = `/surveys/${survey.id}/measurements`;
		const fields = {
			memberId: String(member.id),
			label: 'CP2',
			testedOn: '2026-03-01',
			basis: 'binder',
			increments: '0 6 3.1\n6 12 2.4\nx 18 1.6'
		};
		const refused = await session.surveyor.postForm(`${page}?/addChloride`, fields);
		expect(await refused.text()).toContain(
			'Line 3: give the from-depth, the to-depth (mm) and the chloride content (%), three numbers.'
		);
		const saved = await session.surveyor.postForm(`${page}?/addChloride`, {
			...fields,
			increments: '0 6 3.1\n6 12 2.4\n12 18 1.6'
		});
		expect(saved.status).toBe(200);
		const html = await (await session.surveyor.get(page)).text();
		expect(html).toContain('Chloride profile CP2');
		expect(html).toContain('outermost: left out of fits');
	});

	it('freezes them with the survey (409) and keeps another organisation’s out (404)', async () => {
		const { survey, member } = await editableRecords(session.actor);
		const created = await session.surveyor.postJson(
			`/api/v1/members/${member.id}/carbonation-tests`,
			TEST
		);
		const { carbonationTest } = await created.json();
		await submitSurvey(session.surveyor, survey.id);
		const again = await session.surveyor.postJson(
			`/api/v1/members/${member.id}/carbonation-tests`,
			{
				...TEST,
				label: 'CT2'
			}
		);
		expect(again.status).toBe(409);
		expect((await again.json()).error.message).toContain('frozen');
		const removed = await session.surveyor.delete(
			`/api/v1/carbonation-tests/${carbonationTest.id}`
		);
		expect(removed.status).toBe(409);
		const foreign = await foreignRecords();
		const stranger = await session.surveyor.postJson(
			`/api/v1/members/${foreign.member.id}/chloride-profiles`,
			PROFILE
		);
		expect(stranger.status).toBe(404);
		// The owner reads the demo's shared structures, but may not record measurements.
		const owner = await signInAs('owner');
		expect(
			(await owner.postJson(`/api/v1/members/${member.id}/carbonation-tests`, TEST)).status
		).toBe(403);
	});
});
