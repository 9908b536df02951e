import { describe, expect, it } from 'vitest';
import { aciRequirement, enRequirement } from '../../../src/lib/analysis/index';
import { memberSchema } from '../../../src/lib/intake/schemas';
import { InputError } from '../../../src/lib/server/domainErrors';
import { parsePastedMembers } from '../../../src/lib/server/intake/pastedMembers';
import { suggestEnCover } from '../../../src/lib/server/intake/requirements';

type Cover = Record<'cMinMm' | 'cNomMm' | 'deltaCDevMm', string | number>;

/** A deck member with `cover`: text as the form posts it, or numbers as JSON sends them. */
const member = (cover: Cover) => ({
	label: 'D-01',
	memberType: 'deck',
	face: 'top',
	exposureClass: 'XD3',
	requirementSource: 'EN 1992-1-1',
	...cover
});

function issuesOf(input: object) {
	const parsed = memberSchema.safeParse(input);
	return parsed.success
		? []
		: parsed.error.issues.map((i) => ({ path: i.path, message: i.message }));
}

describe('memberSchema relates c_nom to c_min and Δc_dev (EN 1992-1-1 §4.4.1.1, Eq. (4.1): c_nom = c_min + Δc_dev)', () => {
	it('accepts c_nom equal to c_min + Δc_dev, as Eq. (4.1) defines it', () => {
		expect(issuesOf(member({ cMinMm: '35', cNomMm: '45', deltaCDevMm: '10' }))).toEqual([]);
	});

	it('accepts a c_nom above c_min + Δc_dev: a project may specify more (EN (4.1) is the least)', () => {
		expect(issuesOf(member({ cMinMm: '35', cNomMm: '50', deltaCDevMm: '10' }))).toEqual([]);
	});

	it('refuses c_nom below c_min + Δc_dev on the cNomMm field, with the figure expected (EN (4.1))', () => {
		expect(issuesOf(member({ cMinMm: '35', cNomMm: '40', deltaCDevMm: '10' }))).toEqual([
			{
				path: ['cNomMm'],
				message: 'c_nom 40 mm is below c_min + Δc_dev = 45 mm (EN 1992-1-1 (4.1)).'
			}
		]);
	});

	it('refuses c_nom below c_min on the cNomMm field, naming both values (EN 1992-1-1 4.4.1)', () => {
		expect(issuesOf(member({ cMinMm: '35', cNomMm: '30', deltaCDevMm: '10' }))).toEqual([
			{
				path: ['cNomMm'],
				message:
					'c_nom 30 mm is below c_min 35 mm: the nominal cover cannot be less than the minimum (EN 1992-1-1 4.4.1).'
			}
		]);
	});

	it('with Δc_dev 0 (EN 4.4.1.3, measured and rejected cover) takes c_nom = c_min and no less', () => {
		expect(issuesOf(member({ cMinMm: '35', cNomMm: '35', deltaCDevMm: '0' }))).toEqual([]);
		expect(issuesOf(member({ cMinMm: '35', cNomMm: '34,5', deltaCDevMm: '0' }))[0].message).toBe(
			'c_nom 34.5 mm is below c_min 35 mm: the nominal cover cannot be less than the minimum (EN 1992-1-1 4.4.1).'
		);
	});

	it('takes decimal commas as the form does: 32,5 + 7,5 = 40 mm (EN (4.1))', () => {
		expect(issuesOf(member({ cMinMm: '32,5', cNomMm: '40', deltaCDevMm: '7,5' }))).toEqual([]);
		expect(issuesOf(member({ cMinMm: '32,5', cNomMm: '39,9', deltaCDevMm: '7,5' }))).toEqual([
			{
				path: ['cNomMm'],
				message: 'c_nom 39.9 mm is below c_min + Δc_dev = 40 mm (EN 1992-1-1 (4.1)).'
			}
		]);
	});

	it('accepts every EN suggestion of the engine, which is (4.1) itself (Table 4.4N, S4)', () => {
		for (const exposureClass of ['XC1', 'XC3', 'XD1', 'XS3'] as const) {
			for (const deltaCDevMm of [0, 5, 10]) {
				const r = enRequirement({ exposureClass, barDiameterMm: 16, deltaCDevMm });
				const cover = { cMinMm: r.cMinMm, cNomMm: r.cNomMm, deltaCDevMm: r.deltaCDevMm };
				expect(issuesOf(member(cover)), exposureClass).toEqual([]);
			}
		}
	});

	it('accepts an ACI 318-19 / ACI 117 requirement in mm, exact or as shown to 0.1 mm (c_min = c_nom − tolerance)', () => {
		// ACI 318-19 Table 20.5.1.3.1: 1.5 in (38.1 mm); ACI 117: 3/8 in (9.525 mm) up to 12 in deep.
		const r = aciRequirement({
			exposure: 'weather-or-ground',
			member: 'slab-joist-wall',
			barSize: 5,
			memberDepthMm: 200
		});
		const exact = { cMinMm: r.cMinMm, cNomMm: r.cNomMm, deltaCDevMm: r.deltaCDevMm };
		expect(issuesOf({ ...member(exact), requirementSource: 'ACI 318' })).toEqual([]);
		const shown = { cMinMm: '28.6', cNomMm: '38.1', deltaCDevMm: '9.5' };
		expect(issuesOf({ ...member(shown), requirementSource: 'ACI 318' })).toEqual([]);
	});

	it('reports a field that is not a number as itself, not as a c_nom shortfall', () => {
		expect(issuesOf(member({ cMinMm: 'thirty', cNomMm: '20', deltaCDevMm: '10' }))).toEqual([
			{ path: ['cMinMm'], message: 'c_min is required and must be a number.' }
		]);
	});
});

describe('the EN suggestion uses the Δc_dev typed (EN 1992-1-1 (4.1), Table 4.4N S4)', () => {
	it('XD1, 16 mm bars: c_min 35 mm; c_nom 45 mm with the recommended 10 mm, 40 mm with 5 mm typed', () => {
		expect(suggestEnCover('XD1', 16)).toMatchObject({ cMinMm: 35, cNomMm: 45, deltaCDevMm: 10 });
		expect(suggestEnCover('XD1', 16, 'S4', 5)).toMatchObject({
			cMinMm: 35,
			cNomMm: 40,
			deltaCDevMm: 5
		});
	});

	it('makes no suggestion for a Δc_dev outside 0–10 mm (EN 1992-1-1 4.4.1.3)', () => {
		expect(suggestEnCover('XD1', 16, 'S4', 12)).toBeNull();
		expect(suggestEnCover('XD1', 16, 'S4', -1)).toBeNull();
	});

	it('a pasted table with a Δc_dev column and no c_min gets c_nom = c_min + that Δc_dev', () => {
		const [m] = parsePastedMembers(
			'label\ttype\tface\texposure\tbar diameter\tdelta c_dev\nB-01\tbeam\tside\tXD1\t12\t5',
			'EN 1992-1-1'
		);
		expect([m.cMinMm, m.cNomMm, m.deltaCDevMm]).toEqual([35, 40, 5]);
	});

	it('a pasted row whose c_nom is below c_min + Δc_dev is refused, naming the row and cNomMm', () => {
		const table = 'label,type,face,exposure,c_min,c_nom,delta c_dev\nB-01,beam,side,XD1,35,40,10';
		expect(() => parsePastedMembers(table, 'EN 1992-1-1')).toThrow(InputError);
		expect(() => parsePastedMembers(table, 'EN 1992-1-1')).toThrow(
			'Row 2: cNomMm: c_nom 40 mm is below c_min + Δc_dev = 45 mm (EN 1992-1-1 (4.1)).'
		);
	});
});
