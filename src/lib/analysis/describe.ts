/**
 * Descriptive statistics of a cover population.
 */
import { mean, sampleSkewness, sampleVariance } from 'simple-statistics';
import { percentileSorted, type PercentileType } from './percentile';
import { requireReadings } from './readings';

export interface CoverDescription {
	n: number;
	meanMm: number;
	/** Sample standard deviation, divisor n − 1. */
	sdMm: number;
	/** Coefficient of variation sd/mean (dimensionless). */
	cov: number;
	minMm: number;
	maxMm: number;
	medianMm: number;
	/** Adjusted Fisher–Pearson skewness G1 = √(n(n−1))/(n−2)·m3/m2^1.5 (scipy bias=False). */
	skewness: number | null;
}

/**
 * Describe sorted readings: n, mean, sample SD, CoV, min, max, median, skewness.
 *
 * Definitions: mean = Σx/n (simple-statistics, compensated summation); sd = √(Σ(x − x̄)²/(n − 1));
 * skewness G1 (simple-statistics sampleSkewness, adjusted; null below 3 readings);
 * median = percentile 0.5 of the chosen type (types 6 and 7 agree at 0.5). Units mm.
 * Cost O(n), three passes. Needs at least 2 readings.
 * @example describeSorted(Float64Array.of(40, 45, 50)) // { n: 3, meanMm: 45, sdMm: 5, ... }
 */
export function describeSorted(sorted: Float64Array, type: PercentileType = 7): CoverDescription {
	const n = sorted.length;
	requireReadings('describe', n, 2);
	// simple-statistics reads only length and indices, so a Float64Array is safe to pass.
	const values = sorted as unknown as number[];
	const meanMm = mean(values);
	// Readings all equal have no spread; summing could leave a rounding residue of 1e-15.
	const sdMm = sorted[0] === sorted[n - 1] ? 0 : Math.sqrt(sampleVariance(values));
	return {
		n,
		meanMm,
		sdMm,
		cov: sdMm === 0 ? 0 : sdMm / meanMm,
		minMm: sorted[0],
		maxMm: sorted[n - 1],
		medianMm: percentileSorted(sorted, 0.5, type),
		skewness: n >= 3 && sdMm > 0 ? sampleSkewness(values) : null
	};
}
