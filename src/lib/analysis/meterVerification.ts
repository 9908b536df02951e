/**
 * Cover meter verification against drilled or broken-out verification holes.
 */
import { linearRegression, mean, sampleStandardDeviation } from 'simple-statistics';
import { requireReadings } from './readings';

/** Fewest holes for a verification to count (common practice; our choice, no standard). */
export const MIN_VERIFICATION_HOLES = 5;

export interface MeterVerification {
	n: number;
	/** a in measured = a + b·reading (mm). */
	interceptMm: number;
	/** b (dimensionless). */
	slope: number;
	/** Mean of (measured − reading), mm: positive when the meter reads low. */
	biasMm: number;
	/** SD of the regression residuals with n − 2 degrees of freedom (mm). */
	residualSdMm: number;
	/** Expanded uncertainty of a corrected reading: ±2 × residual SD (≈ 95 %), mm. */
	uncertaintyMm: number;
	/** n ≥ MIN_VERIFICATION_HOLES. */
	enough: boolean;
}

/**
 * Calibrate a meter from pairs (meter reading, measured cover in the hole), both mm:
 * least squares measured = a + b·reading (simple-statistics linearRegression), bias, residual SD
 * √(Σe²/(n − 2)) and the uncertainty ±2·s_e. Cost O(n). Needs 3 holes.
 * @example verifyMeter([40, 50, 60], [42, 52, 62]) // { interceptMm: 2, slope: 1, biasMm: 2, ... }
 */
export function verifyMeter(
	readingsMm: readonly number[],
	measuredMm: readonly number[]
): MeterVerification {
	const n = readingsMm.length;
	if (measuredMm.length !== n) throw new Error('verifyMeter needs one measured cover per reading');
	requireReadings('verifyMeter', n, 3);
	const pairs = readingsMm.map((r, i) => [r, measuredMm[i]]);
	const { m: slope, b: interceptMm } = linearRegression(pairs);
	let squares = 0;
	for (let i = 0; i < n; i++) {
		const e = measuredMm[i] - (interceptMm + slope * readingsMm[i]);
		squares += e * e;
	}
	const residualSdMm = Math.sqrt(squares / (n - 2));
	const differences = measuredMm.map((m, i) => m - readingsMm[i]);
	return {
		n,
		interceptMm,
		slope,
		biasMm: mean(differences),
		residualSdMm,
		uncertaintyMm: 2 * residualSdMm,
		enough: n >= MIN_VERIFICATION_HOLES
	};
}

/** Spread of the raw differences (measured − reading), mm; a quick check beside the regression. */
export function differenceSdMm(
	readingsMm: readonly number[],
	measuredMm: readonly number[]
): number {
	requireReadings('differenceSdMm', readingsMm.length, 2);
	return sampleStandardDeviation(measuredMm.map((m, i) => m - readingsMm[i]));
}

/** Corrected readings a + b·reading (mm), new array. Cost O(n). */
export function correctReadings(
	coversMm: readonly number[] | Float64Array,
	calibration: MeterVerification
): Float64Array {
	const out = new Float64Array(coversMm.length);
	for (let i = 0; i < out.length; i++)
		out[i] = calibration.interceptMm + calibration.slope * coversMm[i];
	return out;
}
