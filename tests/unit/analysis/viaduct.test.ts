// The real published population: 200 cover readings of a viaduct deck, RILEM TC 230-PSC
// (Monteiro, Gonçalves & Gulikers 2014/2015, Fig. 9.4); reference figures from
// /work/shared/datasets/README.md (R 4.2 and scipy 1.10). Monte Carlo p-values: scipy 1.10.1
// stats.goodness_of_fit(norm, x, n_mc_samples=20000, random_state=1).
import { describe, expect, it } from 'vitest';
import {
	assessPopulation,
	compareModels,
	describeSorted,
	percentileSorted,
	projectRequirement,
	toSortedCovers
} from '../../../src/lib/analysis/index';
import { viaductCoversMm } from './viaduct';

const covers = viaductCoversMm();
const sorted = toSortedCovers(covers);

/** Requirement with c_min = limit and 10 % allowed below, as in the worked conformity example. */
const atLimit = (cMinMm: number) =>
	projectRequirement(cMinMm + 10, 10, { allowedFractionBelow: 0.1 });

describe('viaduct deck (RILEM TC 230-PSC)', () => {
	it('reproduces n, mean, SD, min, max, median (README reference figures)', () => {
		const d = describeSorted(sorted);
		expect(d.n).toBe(200);
		expect(d.meanMm).toBeCloseTo(62.195, 3);
		expect(d.sdMm).toBeCloseTo(9.9676, 4);
		expect([d.minMm, d.maxMm, d.medianMm]).toEqual([28, 80, 61.5]);
	});

	it.each([6, 7] as const)('P5 = 47.0 and P10 = 49.0 with type %i (README)', (type) => {
		expect(percentileSorted(sorted, 0.05, type)).toBeCloseTo(47.0, 10);
		expect(percentileSorted(sorted, 0.1, type)).toBeCloseTo(49.0, 10);
	});

	it('conforms at 45 mm and 10 %: 5/200, Clopper–Pearson 95 % upper bound 0.0518 (README)', () => {
		const a = assessPopulation(covers, atLimit(45));
		expect(a.fractionBelowCMin.count).toBe(5);
		expect(a.fractionBelowCMin.upperBound).toBeCloseTo(0.0518, 4);
		const rule = a.rules.find((r) => r.id === 'fraction-below-min');
		expect(rule?.outcome).toBe('pass');
	});

	it('does not conform at 50 mm: 22/200 = 0.11, upper bound 0.1533 (README)', () => {
		const a = assessPopulation(covers, atLimit(50));
		expect(a.fractionBelowCMin.count).toBe(22);
		expect(a.fractionBelowCMin.empirical).toBeCloseTo(0.11, 12);
		expect(a.fractionBelowCMin.upperBound).toBeCloseTo(0.1533, 4);
		expect(a.rules.find((r) => r.id === 'fraction-below-min')?.outcome).toBe('fail');
		expect(a.verdict).toBe('fail');
	});

	it('3 readings below 40 mm (README)', () => {
		expect(assessPopulation(covers, atLimit(40)).fractionBelowCMin.count).toBe(3);
	});

	it('rejects the normal model and warns in words (README: Shapiro–Wilk p = 0.0024)', () => {
		const m = compareModels(sorted);
		expect(m.normal.rejected).toBe(true);
		expect(m.warnings.length).toBeGreaterThan(0);
		expect(m.warnings[0]).toMatch(/normal/);
		const a = assessPopulation(covers, atLimit(45));
		expect(a.warnings.join(' ')).toMatch(/does not fit|Neither/);
	});

	it('A² and D match scipy 1.10.1 anderson/kstest; p-values match its Monte Carlo', () => {
		const m = compareModels(sorted);
		expect(m.normal.andersonDarling?.statistic).toBeCloseTo(1.1988155217358667, 9);
		expect(m.lognormal?.andersonDarling?.statistic).toBeCloseTo(1.269486804293308, 9);
		expect(m.normal.kolmogorovSmirnov?.statistic).toBeCloseTo(0.08571951784850723, 10);
		// scipy Monte Carlo: AD p = 0.0042, KS (Lilliefors) p = 0.0012; MC error ≈ ±0.0005.
		expect(Math.abs((m.normal.andersonDarling?.pValue ?? 1) - 0.0042)).toBeLessThan(0.0015);
		expect(Math.abs((m.normal.kolmogorovSmirnov?.pValue ?? 1) - 0.0012)).toBeLessThan(0.0006);
	});

	it('skewness matches scipy 1.10.1 skew(bias=False) = −0.165188', () => {
		expect(describeSorted(sorted).skewness).toBeCloseTo(-0.16518812490119958, 10);
	});
});
