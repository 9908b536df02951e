import { describe, expect, it } from 'vitest';
import {
	andersonDarlingPValue,
	compareModels,
	describeSorted,
	erf,
	erfc,
	erfcInverse,
	mulberry32,
	normalCdf,
	normalQuantile,
	normalSampler,
	percentileSorted,
	toSortedCovers
} from '../../../src/lib/analysis/index';

// Worked sample, checked by hand with R's ?quantile definitions (Hyndman & Fan 1996):
// x = 2, 4, 4, 5, 7, 9, 10, 12 (n = 8).
// type 7: h = (n − 1)p + 1.  p = 0.1: h = 1.7 → 2 + 0.7·(4 − 2) = 3.4;  p = 0.4: h = 3.8 → 4 + 0.8·(5 − 4) = 4.8;
//         p = 0.9: h = 7.3 → 10 + 0.3·(12 − 10) = 10.6
// type 6: h = (n + 1)p.      p = 0.1: h = 0.9 < 1 → x(1) = 2;  p = 0.4: h = 3.6 → 4 + 0.6 = 4.6;
//         p = 0.9: h = 8.1 > n → x(8) = 12
// (numpy 1.24 percentile methods 'linear' and 'weibull' give the same six numbers.)
const SAMPLE = toSortedCovers([12, 4, 7, 2, 10, 4, 9, 5]);

describe('percentiles (Hyndman & Fan 1996; R ?quantile types 6 and 7)', () => {
	it.each([
		[0.1, 7, 3.4],
		[0.4, 7, 4.8],
		[0.9, 7, 10.6],
		[0.1, 6, 2],
		[0.4, 6, 4.6],
		[0.9, 6, 12]
	] as const)('p = %f, type %i gives %f (hand arithmetic above)', (p, type, expected) => {
		expect(percentileSorted(SAMPLE, p, type)).toBeCloseTo(expected, 12);
	});

	it('rejects an empty population with the house message', () => {
		expect(() => percentileSorted(new Float64Array(0), 0.5)).toThrow(
			'percentile needs at least 1 readings'
		);
	});
});

describe('describe', () => {
	it('mean, SD, skewness of the worked sample (hand: mean 53/8; scipy 1.10 skew(bias=False) 0.311278)', () => {
		const d = describeSorted(SAMPLE);
		expect(d.meanMm).toBeCloseTo(53 / 8, 12);
		// Σ(x − 6.625)² = 83.875, /7 → s = 3.4615232 (numpy std ddof=1)
		expect(d.sdMm).toBeCloseTo(3.4615231989895516, 10);
		expect(d.skewness).toBeCloseTo(0.3112780739219417, 10);
		expect(d.medianMm).toBe(6);
		expect([d.minMm, d.maxMm]).toEqual([2, 12]);
	});
	it('does not change the caller’s array (sort once, on a copy)', () => {
		const raw = [3, 1, 2];
		toSortedCovers(raw);
		expect(raw).toEqual([3, 1, 2]);
	});
	it('returns a copy of input already in order, and sorts input with one step out of order', () => {
		const inOrder = Float64Array.of(1, 2, 2, 5);
		const copy = toSortedCovers(inOrder);
		expect(copy).not.toBe(inOrder);
		expect(Array.from(copy)).toEqual([1, 2, 2, 5]);
		expect(Array.from(toSortedCovers(Float64Array.of(1, 2, 5, 4)))).toEqual([1, 2, 4, 5]);
	});
});

describe('error function and normal distribution (Abramowitz & Stegun)', () => {
	it.each([
		[0.5, 0.5204998778],
		[1, 0.8427007929],
		[2, 0.995322265]
	])('erf(%f) = %f (A&S Table 7.1)', (x, value) => {
		expect(erf(x)).toBeCloseTo(value, 9);
		expect(erf(-x)).toBeCloseTo(-value, 9);
	});
	it.each([
		[1, 0.8413447461],
		[2, 0.9772498681],
		[3, 0.998650102],
		[1.3, 0.9031995154]
	])('Φ(%f) = %f (A&S Table 26.1)', (z, value) => {
		expect(normalCdf(z)).toBeCloseTo(value, 9);
	});
	it('keeps relative precision in the tail (scipy 1.10 special.erfc / norm.cdf)', () => {
		expect(erfc(3) / 2.2090496998585445e-5).toBeCloseTo(1, 12);
		expect(erfc(5) / 1.5374597944280347e-12).toBeCloseTo(1, 12);
		expect(normalCdf(-8) / 6.22096057427174e-16).toBeCloseTo(1, 10);
	});
	it.each([
		[0.95, 1.644853627],
		[0.975, 1.959963985],
		[0.99, 2.326347874]
	])('z(%f) = %f (A&S Table 26.5 percentage points)', (p, z) => {
		expect(normalQuantile(p)).toBeCloseTo(z, 8);
	});
	it('erfcInverse inverts erfc (erfc(0.5) = 1 − 0.5204998778, A&S 7.1)', () => {
		expect(erfcInverse(1 - 0.5204998778)).toBeCloseTo(0.5, 8);
	});
});

describe('goodness of fit', () => {
	it('Anderson–Darling p-value formulas (D’Agostino & Stephens 1986 Table 4.9) at their knots', () => {
		// At A*² = 0.6 the two branches meet within the table's rounding.
		const below = Math.exp(0.9177 - 4.279 * 0.6 - 1.38 * 0.36);
		expect(andersonDarlingPValue(0.599999)).toBeCloseTo(below, 5);
		expect(andersonDarlingPValue(0.6)).toBeCloseTo(below, 2);
		// Critical value of A*² at 5 % for case 3 is 0.752 (Stephens 1974, from memory).
		expect(andersonDarlingPValue(0.752)).toBeCloseTo(0.05, 2);
	});
	it('a seeded normal sample is not rejected; a mixed population is, with a warning in words', () => {
		const z = normalSampler(mulberry32(11));
		const normal = toSortedCovers(Array.from({ length: 300 }, () => 50 + 6 * z()));
		expect(compareModels(normal).normal.rejected).toBe(false);
		// Two populations: 85 % around 55 mm and a 15 % patch around 30 mm (common practice scenario).
		const mixed = toSortedCovers(
			Array.from({ length: 400 }, (_, i) => (i % 100 < 15 ? 30 : 55) + 3 * z())
		);
		const m = compareModels(mixed);
		expect(m.normal.rejected).toBe(true);
		expect(m.lognormal?.rejected).toBe(true);
		expect(m.warnings.join(' ')).toMatch(/two populations/);
	});
});
