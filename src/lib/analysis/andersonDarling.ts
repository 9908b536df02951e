/**
 * Anderson–Darling goodness of fit with both parameters estimated ("case 3").
 * Reference: R. B. D'Agostino & M. A. Stephens (eds.), Goodness-of-Fit Techniques, Dekker 1986,
 * §4.8 and Table 4.9 (modified statistic and p-value formulas). Our own code: neither jstat nor
 * simple-statistics has an Anderson–Darling test.
 */
import type { FittedModel } from './fitModels';
import { type ModelProbabilities, modelProbabilities } from './modelProbabilities';
import { requireReadings } from './readings';

export interface AndersonDarlingResult {
	/** A² = −n − (1/n)·Σ(2i − 1)[ln F(x(i)) + ln(1 − F(x(n+1−i)))]. */
	statistic: number;
	/** Small-sample corrected A*² = A²·(1 + 0.75/n + 2.25/n²). */
	modified: number;
	/** Approximate p-value from A*² (D'Agostino & Stephens Table 4.9); 0 beyond A*² = 13. */
	pValue: number;
}

/** p-value of the modified statistic, D'Agostino & Stephens (1986) Table 4.9, case 3. */
export function andersonDarlingPValue(modified: number): number {
	const a = modified;
	let p: number;
	if (a < 0.2) p = 1 - Math.exp(-13.436 + 101.14 * a - 223.73 * a * a);
	else if (a < 0.34) p = 1 - Math.exp(-8.318 + 42.796 * a - 59.938 * a * a);
	else if (a < 0.6) p = Math.exp(0.9177 - 4.279 * a - 1.38 * a * a);
	else if (a <= 13) p = Math.exp(1.2937 - 5.709 * a + 0.0186 * a * a);
	else p = 0;
	return Math.min(1, Math.max(0, p));
}

/**
 * Anderson–Darling test from precomputed model probabilities of sorted readings.
 * Sums ln F and ln(1 − F) as given (finite for any reading). Cost O(n). Needs 8 readings (the p-value formulas start at n = 8).
 */
export function andersonDarlingFromProbabilities(
	probabilities: ModelProbabilities
): AndersonDarlingResult {
	// In log space: ln F of a reading far in the tail is finite where F itself underflows to 0.
	const { logCdf, logSurvival } = probabilities;
	const n = logCdf.length;
	requireReadings('andersonDarling', n, 8);
	let sum = 0;
	for (let i = 0; i < n; i++) {
		sum += (2 * i + 1) * (logCdf[i] + logSurvival[n - 1 - i]);
	}
	const statistic = -n - sum / n;
	const modified = statistic * (1 + 0.75 / n + 2.25 / (n * n));
	return { statistic, modified, pValue: andersonDarlingPValue(modified) };
}

/**
 * Anderson–Darling test of sorted readings against a fitted normal or lognormal model
 * (for the lognormal the test is on ln x, which keeps the order, so no second sort).
 *
 * Definitions in the result fields. Cost O(n): one erfc and two logarithms a reading.
 * Needs 8 readings.
 * @example andersonDarling(sorted, fitNormal(sorted)).pValue // e.g. 0.31
 */
export function andersonDarling(sorted: Float64Array, fit: FittedModel): AndersonDarlingResult {
	requireReadings('andersonDarling', sorted.length, 8);
	return andersonDarlingFromProbabilities(modelProbabilities(sorted, fit));
}
