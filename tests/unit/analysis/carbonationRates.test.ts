import { describe, expect, it } from 'vitest';
import {
	carbonationFront,
	carbonationRate,
	carbonationRates
} from '../../../src/lib/analysis/index';

describe('carbonation rate k = x/√t per test location (worked by hand)', () => {
	it('depths 8, 10, 12 mm at 16 years: x̄ = 10 mm, √16 = 4, k = 10/4 = 2.5 mm/√a; k_min 8/4 = 2, k_max 12/4 = 3', () => {
		const r = carbonationRate({ memberId: 7, label: 'B3', depthsMm: [8, 10, 12], ageYears: 16 });
		expect(r.kMmPerSqrtYear).toBeCloseTo(2.5, 12);
		expect(r.kMinMmPerSqrtYear).toBeCloseTo(2, 12);
		expect(r.kMaxMmPerSqrtYear).toBeCloseTo(3, 12);
		expect([r.minDepthMm, r.meanDepthMm, r.maxDepthMm, r.readings]).toEqual([8, 10, 12, 3]);
		// s = √((4 + 0 + 4)/2) = 2 mm; s.e. of k = 2/√3/4 = 0.288675
		expect(r.kStandardError).toBeCloseTo(0.2886751346, 9);
		expect(r.memberId).toBe(7);
		expect(r.label).toBe('B3');
	});
	it('one depth read: no within-location standard error; depth 0 gives k = 0', () => {
		expect(carbonationRate({ depthsMm: [0], ageYears: 9 })).toMatchObject({
			kMmPerSqrtYear: 0,
			kStandardError: null
		});
	});
	it('refuses t = 0 (k undefined), negative or NaN depths, no depths, naming the test', () => {
		expect(() => carbonationRate({ depthsMm: [5], ageYears: 0 })).toThrow(/age must be .* > 0/);
		expect(() =>
			carbonationRates([
				{ depthsMm: [5], ageYears: 9 },
				{ depthsMm: [5, -1], ageYears: 9 }
			])
		).toThrow(/carbonation test 2: depth reading 2/);
		expect(() => carbonationRate({ depthsMm: [NaN], ageYears: 9 })).toThrow(/depth reading 1/);
		expect(() => carbonationRate({ depthsMm: [], ageYears: 9 })).toThrow(/at least 1 depth/);
		expect(() => carbonationRates([])).toThrow(/at least 1 carbonation test/);
	});
});

// Four locations: 10 mm at 16 a → 2.5; 15 mm at 25 a → 3.0; 12 mm at 36 a → 2.0; 14 mm at 16 a → 3.5.
// mean 11/4 = 2.75; SD = √((0.0625 + 0.0625 + 0.5625 + 0.5625)/3) = √(1.25/3) = 0.645497.
const FOUR = [
	{ depthsMm: [10], ageYears: 16 },
	{ depthsMm: [15], ageYears: 25 },
	{ depthsMm: [12], ageYears: 36 },
	{ depthsMm: [14], ageYears: 16 }
];

describe('population of k and the front x(t) = k√t', () => {
	it('n, mean, SD by hand; characteristic k = mean + k_n·s with k_n(4) = 2.63 (EN 1990 Table D1, V_x unknown)', () => {
		const pop = carbonationRates(FOUR);
		expect(pop.n).toBe(4);
		expect(pop.meanMmPerSqrtYear).toBeCloseTo(2.75, 12);
		expect(pop.sdMmPerSqrtYear).toBeCloseTo(0.6454972244, 9);
		// t(0.95; 3) = 2.353363 (Student's t tables), ×√(1 + 1/4) = 2.631140
		expect(pop.characteristic?.factor).toBeCloseTo(2.63114, 4);
		expect(pop.characteristic?.method).toBe('prediction');
		expect(pop.characteristic?.p).toBe(0.05);
		expect(pop.characteristic?.kMmPerSqrtYear).toBeCloseTo(2.75 + 2.63114 * 0.6454972, 4);
		expect(pop.warnings.join(' ')).toMatch(/Only 4 test locations/);
	});
	it('the model method uses z(0.95) = 1.6449 (A&S Table 26.5)', () => {
		const pop = carbonationRates(FOUR, { method: 'model' });
		expect(pop.characteristic?.factor).toBeCloseTo(1.644854, 5);
	});
	it('front at 50 a: mean 2.75·√50 = 19.445 mm, SD 0.6455·√50 = 4.564 mm; at t = 0 the front is at 0', () => {
		const pop = carbonationRates(FOUR);
		const f = carbonationFront(pop, 50);
		expect(f.meanMm).toBeCloseTo(19.44544, 4);
		expect(f.sdMm).toBeCloseTo(4.564355, 5);
		expect(carbonationFront(pop, 0)).toMatchObject({ meanMm: 0, sdMm: 0 });
		expect(() => carbonationFront(pop, -1)).toThrow(/age/);
		expect(() => carbonationFront(pop, NaN)).toThrow(/age/);
	});
	it('one location: mean only, SD and characteristic null (no NaN), said in a warning', () => {
		const pop = carbonationRates([FOUR[0]]);
		expect(pop.sdMmPerSqrtYear).toBeNull();
		expect(pop.characteristic).toBeNull();
		expect(carbonationFront(pop, 25)).toMatchObject({
			meanMm: 12.5,
			sdMm: null,
			characteristicMm: null
		});
		expect(pop.warnings[0]).toMatch(/One test location/);
	});
});
