/**
 * Sample percentiles by Hyndman & Fan (1996), "Sample quantiles in statistical packages",
 * The American Statistician 50(4) 361–365; the same definitions as R's ?quantile.
 */
import { requireReadings } from './readings';

/** Type 7 (R's default, spreadsheet PERCENTILE.INC) or type 6 (Minitab/SPSS style). */
export type PercentileType = 6 | 7;

/**
 * The p-quantile of sorted readings.
 *
 * Definition (1-based order statistics x(1) ≤ … ≤ x(n)):
 * - type 7: h = (n − 1)·p + 1;  Q = x(⌊h⌋) + (h − ⌊h⌋)·(x(⌊h⌋+1) − x(⌊h⌋))
 * - type 6: h = (n + 1)·p;      same interpolation, clamped to x(1) and x(n)
 * Units: those of the readings (mm). Cost O(1) on sorted data.
 * @example percentileSorted(Float64Array.of(1, 2, 3, 4), 0.25, 7) // 1.75
 */
export function percentileSorted(
	sorted: Float64Array,
	p: number,
	type: PercentileType = 7
): number {
	const n = sorted.length;
	requireReadings('percentile', n, 1);
	if (!(p >= 0 && p <= 1)) throw new Error('percentile needs 0 ≤ p ≤ 1');
	if (type !== 6 && type !== 7) throw new Error(`percentile type must be 6 or 7, not ${type}`);
	const h = type === 7 ? (n - 1) * p + 1 : (n + 1) * p;
	if (h <= 1) return sorted[0];
	if (h >= n) return sorted[n - 1];
	const lower = Math.floor(h);
	const fraction = h - lower;
	return sorted[lower - 1] + fraction * (sorted[lower] - sorted[lower - 1]);
}
