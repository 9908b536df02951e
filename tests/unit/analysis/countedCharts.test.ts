/**
 * Chart data from counts equals chart data from the readings. Source of each expected value: the
 * engine's sorted-array chart functions (histogramSorted — Freedman & Diaconis 1981 bins —,
 * ecdfPoints, normalProbabilityPlot with R's ppoints positions) run on the same readings
 * expanded; those are checked against their definitions in statistics.test.ts. Equality is to
 * the bit: the counted forms bin the same doubles and pick the same order statistics.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
	ecdfPoints,
	ecdfPointsCounted,
	normalProbabilityPlot,
	normalProbabilityPlotCounted
} from '../../../src/lib/analysis/charts';
import { countedFromSorted } from '../../../src/lib/analysis/countedSample';
import { histogramCounted, histogramSorted } from '../../../src/lib/analysis/histogram';
import { drawOnGrid, GRIDS } from '../../helpers/quantized';

/** Readings on a meter's grid (1, 0.5, 0.1 mm or 0.05 in), as the import stores them. */
const quantized = fc
	.record({
		grid: fc.constantFrom(...GRIDS),
		centre: fc.integer({ min: -10, max: 80 }),
		spread: fc.integer({ min: 0, max: 15 }),
		n: fc.integer({ min: 1, max: 1500 }),
		seed: fc.integer({ min: 1, max: 2 ** 30 })
	})
	.map(({ grid, centre, spread, n, seed }) =>
		drawOnGrid(grid, centre, spread, n, seed, true).sort()
	);

describe('chart data from counts', () => {
	it('bins exactly as the histogram of the readings (Freedman–Diaconis and fixed widths)', () => {
		fc.assert(
			fc.property(quantized, fc.constantFrom(undefined, 0.5, 1, 2.5), (sorted, width) => {
				const counted = countedFromSorted(sorted);
				expect(histogramCounted(counted, width)).toEqual(histogramSorted(sorted, width));
			}),
			{ numRuns: 200 }
		);
	});

	it('gives the same thinned ECDF and normal probability plot points', () => {
		fc.assert(
			fc.property(quantized, fc.constantFrom(2, 7, 500), (sorted, maxPoints) => {
				const counted = countedFromSorted(sorted);
				expect(ecdfPointsCounted(counted, maxPoints)).toEqual(ecdfPoints(sorted, maxPoints));
				expect(normalProbabilityPlotCounted(counted, maxPoints)).toEqual(
					normalProbabilityPlot(sorted, maxPoints)
				);
			}),
			{ numRuns: 200 }
		);
	});

	it('holds a worked case: 1, 2, 2, 3 mm in 1 mm bins and its ECDF', () => {
		// By hand from the definitions: bins [1,2) [2,3] hold 1 and 3; F_n at 1, 2, 2, 3 is ¼, ½, ¾, 1.
		const counted = countedFromSorted(Float64Array.of(1, 2, 2, 3));
		expect(histogramCounted(counted, 1)).toEqual([
			{ fromMm: 1, toMm: 2, count: 1 },
			{ fromMm: 2, toMm: 3, count: 3 }
		]);
		expect(ecdfPointsCounted(counted).map((p) => [p.coverMm, p.fraction])).toEqual([
			[1, 0.25],
			[2, 0.5],
			[2, 0.75],
			[3, 1]
		]);
	});
});
