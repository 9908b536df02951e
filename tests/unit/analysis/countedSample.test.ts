/**
 * The counted form of a population gives the figures the raw readings give. Each property draws
 * random quantized readings (a meter's grid of 1, 0.5 or 0.1 mm, or 0.05 in), computes every
 * figure from the sorted readings with the engine's raw functions — themselves checked against
 * scipy and published examples in the other engine tests — and from the counts, and asserts
 * equality to 1e-12 relative (order statistics and counts to the bit).
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { andersonDarling } from '../../../src/lib/analysis/andersonDarling';
import { characteristicCovers } from '../../../src/lib/analysis/characteristicCover';
import {
	andersonDarlingCounted,
	characteristicCoversCounted,
	countAtOrBelowCounted,
	countBelowCounted,
	countedFromSorted,
	describeCounted,
	expandCounted,
	fitLognormalCounted,
	fitNormalCounted,
	fractionBelowCounted,
	kolmogorovSmirnovCounted,
	mapCounted,
	mergeCounted,
	momentsCounted,
	percentileCounted
} from '../../../src/lib/analysis/countedSample';
import { detectGrid } from '../../../src/lib/analysis/coverGrid';
import { describeSorted } from '../../../src/lib/analysis/describe';
import { fitLognormal, fitNormal } from '../../../src/lib/analysis/fitModels';
import { compareModels, compareModelsCounted } from '../../../src/lib/analysis/goodnessOfFit';
import { fractionBelow } from '../../../src/lib/analysis/fractionBelow';
import { kolmogorovSmirnov } from '../../../src/lib/analysis/lilliefors';
import { percentileSorted } from '../../../src/lib/analysis/percentile';
import { countAtOrBelowSorted, countBelowSorted } from '../../../src/lib/analysis/readings';
import { drawOnGrid, GRIDS } from '../../helpers/quantized';

const RELATIVE = 1e-12;

/** |a − b| ≤ 1e-12·max(|a|, |b|), or ≤ 1e-15·scale where a figure sits near 0 beside the data's scale. */
function close(a: number | null, b: number | null, scale = 1): void {
	if (a === null || b === null) return expect(a).toBe(b);
	if (!Number.isFinite(a) || !Number.isFinite(b)) return expect(a).toBe(b);
	const bound = Math.max(RELATIVE * Math.max(Math.abs(a), Math.abs(b)), 1e-15 * scale);
	expect(Math.abs(a - b), `${a} vs ${b}`).toBeLessThanOrEqual(bound);
}

/** Readings on a meter's grid as the import stores them (k/den mm, or (k/den)·25.4 for inches). */
const quantized = fc
	.record({
		grid: fc.constantFrom(...GRIDS),
		centre: fc.integer({ min: 20, max: 80 }),
		spread: fc.integer({ min: 0, max: 15 }),
		n: fc.integer({ min: 8, max: 400 }),
		seed: fc.integer({ min: 1, max: 2 ** 30 })
	})
	.map(({ grid, centre, spread, n, seed }) => drawOnGrid(grid, centre, spread, n, seed).sort());

describe('counted samples equal the raw readings', () => {
	it('finds the grid the readings were logged on (0.1 mm; 0.05 in = 1.27 mm)', () => {
		expect(detectGrid(Float64Array.of(40.1, 41, 43.7))).toEqual({ den: 10, factor: 1 });
		expect(detectGrid(Float64Array.of(1.05 * 25.4, 1.1 * 25.4))).toEqual({ den: 20, factor: 25.4 });
		expect(detectGrid(Float64Array.of(0.1 + 0.2))).toBeNull();
	});

	it('expands back to the readings, to the bit', () => {
		fc.assert(
			fc.property(quantized, (sorted) => {
				const counted = countedFromSorted(sorted);
				expect(counted.lattice).not.toBeNull();
				expect(Array.from(expandCounted(counted))).toEqual(Array.from(sorted));
			})
		);
	});

	it('n, mean, SD and skewness (describeSorted), percentiles of types 6 and 7, counts below', () => {
		fc.assert(
			fc.property(quantized, fc.double({ min: 0, max: 1, noNaN: true }), (sorted, p) => {
				const counted = countedFromSorted(sorted);
				for (const type of [6, 7] as const) {
					const raw = describeSorted(sorted, type);
					const fromCounts = describeCounted(counted, type);
					expect(fromCounts.n).toBe(raw.n);
					close(fromCounts.meanMm, raw.meanMm);
					close(fromCounts.sdMm, raw.sdMm, raw.meanMm);
					close(fromCounts.cov, raw.cov);
					expect(fromCounts.minMm).toBe(raw.minMm);
					expect(fromCounts.maxMm).toBe(raw.maxMm);
					expect(fromCounts.medianMm).toBe(raw.medianMm);
					if (raw.skewness === null) expect(fromCounts.skewness).toBeNull();
					// Skewness is O(1) and near 0 for symmetric data, where Σd³ cancels: 1e-12 absolute is
					// its relative bound at the scale of the statistic.
					else close(fromCounts.skewness, raw.skewness, 1000);
					expect(percentileCounted(counted, p, type)).toBe(percentileSorted(sorted, p, type));
				}
				const limit = sorted[Math.floor(p * (sorted.length - 1))];
				expect(countBelowCounted(counted, limit)).toBe(countBelowSorted(sorted, limit));
				expect(countAtOrBelowCounted(counted, limit)).toBe(countAtOrBelowSorted(sorted, limit));
			})
		);
	});

	it('fits, Kolmogorov–Smirnov and Anderson–Darling with ties, fraction below, characteristic values', () => {
		fc.assert(
			fc.property(quantized, (sorted) => {
				fc.pre(sorted[0] !== sorted[sorted.length - 1]);
				const counted = countedFromSorted(sorted);
				const normal = fitNormal(sorted);
				const lognormal = fitLognormal(sorted);
				const cNormal = fitNormalCounted(counted);
				const cLognormal = fitLognormalCounted(counted);
				close(cNormal.location, normal.location);
				close(cNormal.scale, normal.scale, normal.location);
				close(cLognormal.location, lognormal.location);
				close(cLognormal.scale, lognormal.scale, Math.abs(lognormal.location));
				// The goodness-of-fit statistics, each under the same fit so only the sum differs.
				for (const fit of [normal, lognormal]) {
					const ks = kolmogorovSmirnov(sorted, fit);
					const cks = kolmogorovSmirnovCounted(counted, fit);
					close(cks.statistic, ks.statistic);
					close(cks.pValue, ks.pValue);
					const ad = andersonDarling(sorted, fit);
					const cad = andersonDarlingCounted(counted, fit);
					// A² = −n − S/n: S/n is about n, so the raw sum's own rounding (≈ n·1e-16 of
					// it) is the bound, relative to n rather than to A².
					expect(Math.abs(cad.statistic - ad.statistic)).toBeLessThanOrEqual(
						RELATIVE * Math.max(Math.abs(ad.statistic), sorted.length)
					);
				}
				const limit = sorted[Math.floor(sorted.length / 10)] + 0.5;
				const rawShare = fractionBelow(sorted, limit, normal, lognormal, 0.9);
				const counts = fractionBelowCounted(counted, limit, normal, lognormal, 0.9);
				expect(counts).toEqual(rawShare);
				const rawChar = characteristicCovers(sorted, normal, lognormal, 0.05, 0.9, 6);
				expect(characteristicCoversCounted(counted, normal, lognormal, 0.05, 0.9, 6)).toEqual(
					rawChar
				);
				// With the counted fits the characteristic values differ only through μ and σ.
				const fromCounted = characteristicCoversCounted(counted, cNormal, cLognormal, 0.05, 0.9, 6);
				close(fromCounted.normal.toleranceMm, rawChar.normal.toleranceMm);
				close(fromCounted.lognormal!.predictionMm, rawChar.lognormal!.predictionMm);
			})
		);
	});

	it('merges members into a population: the merged counts equal the concatenated readings', () => {
		fc.assert(
			fc.property(fc.array(quantized, { minLength: 1, maxLength: 6 }), (members) => {
				const all = Float64Array.from(members.flatMap((m) => Array.from(m))).sort();
				const merged = mergeCounted(members.map((m) => countedFromSorted(m)));
				expect(merged.n).toBe(all.length);
				expect(Array.from(expandCounted(merged))).toEqual(Array.from(all));
				const raw = describeSorted(all.length >= 2 ? all : Float64Array.of(all[0], all[0]));
				if (all.length >= 2) {
					close(momentsCounted(merged).mean, raw.meanMm);
					close(momentsCounted(merged).sd, raw.sdMm, raw.meanMm);
				}
			})
		);
	});

	it('keeps a calibrated population (a + b·r, off the grid) exact by mapping the grid', () => {
		fc.assert(
			fc.property(
				quantized,
				fc.double({ min: -5, max: 5, noNaN: true }),
				fc.double({ min: 0.8, max: 1.25, noNaN: true }),
				(sorted, a, b) => {
					const calibrated = sorted.map((r) => a + b * r);
					const mapped = mapCounted(countedFromSorted(sorted), a, b);
					expect(mapped.lattice).not.toBeNull();
					expect(Array.from(expandCounted(mapped))).toEqual(Array.from(calibrated));
					const raw = describeSorted(calibrated);
					const fromCounts = describeCounted(mapped);
					close(fromCounts.meanMm, raw.meanMm);
					close(fromCounts.sdMm, raw.sdMm, raw.meanMm);
					expect(fromCounts.medianMm).toBe(raw.medianMm);
					for (const p of [0.05, 0.1, 0.95])
						expect(percentileCounted(mapped, p, 6)).toBe(percentileSorted(calibrated, p, 6));
				}
			)
		);
	});

	it('gives a worked example: 40, 40, 41, 43 mm', () => {
		// Hand computation (common practice definitions): mean 41, SD √(6/3) = √2, P50 type 7 = 40.5.
		const counted = countedFromSorted(Float64Array.of(40, 40, 41, 43));
		expect(Array.from(counted.counts)).toEqual([2, 1, 1]);
		expect(momentsCounted(counted)).toEqual({ n: 4, mean: 41, sd: Math.SQRT2 });
		expect(percentileCounted(counted, 0.5, 7)).toBe(40.5);
	});
});

describe('model comparison from counts', () => {
	it('equals compareModels of the readings: fits, tests, choice and warnings', () => {
		fc.assert(
			fc.property(quantized, (sorted) => {
				const raw = compareModels(sorted);
				const counted = compareModelsCounted(countedFromSorted(sorted));
				expect(counted.resolutionMm).toBe(raw.resolutionMm);
				expect(counted.better).toBe(raw.better);
				expect(counted.warnings).toEqual(raw.warnings);
				for (const model of ['normal', 'lognormal'] as const) {
					const a = raw[model]!;
					const b = counted[model]!;
					close(b.location, a.location);
					close(b.scale, a.scale, Math.abs(a.location) + 1);
					expect(b.rejected).toBe(a.rejected);
					expect(b.decidedBy).toBe(a.decidedBy);
					// D is a probability read through each path's own μ and σ, which differ in the last
					// bits and are amplified by x/σ (up to ~10^3 here): 1e-10 absolute. Under one shared
					// fit D agrees to 1e-12 relative (the test above).
					if (a.kolmogorovSmirnov && b.kolmogorovSmirnov)
						expect(
							Math.abs(a.kolmogorovSmirnov.statistic - b.kolmogorovSmirnov.statistic)
						).toBeLessThanOrEqual(1e-10);
					else expect(b.kolmogorovSmirnov).toBe(a.kolmogorovSmirnov);
					// The grouped test sums the same classes; its expectations differ only through μ, σ.
					if (a.grouped && b.grouped) {
						expect(b.grouped.classes).toBe(a.grouped.classes);
						expect(Math.abs(b.grouped.statistic - a.grouped.statistic)).toBeLessThanOrEqual(
							1e-9 * Math.max(1, a.grouped.statistic)
						);
					} else expect(b.grouped).toBe(a.grouped);
				}
			})
		);
	});
});
