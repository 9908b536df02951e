/**
 * Cover meter verification against drilled or broken-out verification holes.
 */
import jStat from 'jstat';
import { linearRegression, mean, sampleStandardDeviation } from 'simple-statistics';
import { requireReadings } from './readings';

/** Fewest holes for a verification to count (common practice; our choice, no standard). */
export const MIN_VERIFICATION_HOLES = 5;

/** Two-sided level of the meter's expanded uncertainty (common practice: 95 %). */
export const METER_UNCERTAINTY_LEVEL = 0.95;

export interface MeterVerification {
	n: number;
	/** a in measured = a + b·reading (mm). */
	interceptMm: number;
	/** b (dimensionless); 1 when every hole had the same meter reading (see slopeFixed). */
	slope: number;
	/**
	 * True when the meter readings of the holes have no spread, so no slope can be estimated:
	 * the calibration is then the bias alone (measured = reading + bias, b = 1).
	 */
	slopeFixed: boolean;
	/** Mean of (measured − reading), mm: positive when the meter reads low. */
	biasMm: number;
	/** SD of the residuals (mm), with n − 2 degrees of freedom (n − 1 when the slope is fixed). */
	residualSdMm: number;
	/** Degrees of freedom of residualSdMm. */
	degreesOfFreedom: number;
	/** Student's t quantile t(1 − (1 − level)/2; dof) behind the uncertainty. */
	tQuantile: number;
	/**
	 * Expanded uncertainty of one corrected reading at the holes' mean reading (mm), a 95 %
	 * prediction interval: t·s_e·√(1 + 1/n) (Draper & Smith, Applied Regression Analysis,
	 * 3rd ed. 1998, §3.1; the x̄ term of the leverage is zero there).
	 */
	uncertaintyMm: number;
	/** n ≥ MIN_VERIFICATION_HOLES. */
	enough: boolean;
}

function residualSquares(x: readonly number[], y: readonly number[], a: number, b: number) {
	let squares = 0;
	for (let i = 0; i < x.length; i++) squares += (y[i] - (a + b * x[i])) ** 2;
	return squares;
}

/**
 * Calibrate a meter from pairs (meter reading, measured cover in the hole), both mm:
 * least squares measured = a + b·reading (simple-statistics linearRegression), bias, residual SD
 * √(Σe²/(n − 2)) and the 95 % prediction uncertainty t(0.975; n − 2)·s_e·√(1 + 1/n). When every
 * hole read the same on the meter, no slope exists: b = 1, a = bias, s from the differences
 * with n − 1 degrees of freedom (slopeFixed). Cost O(n). Needs 3 holes.
 * @example verifyMeter([40, 50, 60], [42, 52, 62]) // { interceptMm: 2, slope: 1, biasMm: 2, ... }
 */
export function verifyMeter(
	readingsMm: readonly number[],
	measuredMm: readonly number[]
): MeterVerification {
	const n = readingsMm.length;
	if (measuredMm.length !== n) throw new Error('verifyMeter needs one measured cover per reading');
	requireReadings('verifyMeter', n, 3);
	if (![...readingsMm, ...measuredMm].every(Number.isFinite))
		throw new Error('verifyMeter needs finite readings and measured covers');
	const differences = measuredMm.map((m, i) => m - readingsMm[i]);
	const biasMm = mean(differences);
	const slopeFixed = readingsMm.every((r) => r === readingsMm[0]);
	let interceptMm = biasMm;
	let slope = 1;
	if (!slopeFixed) {
		({ m: slope, b: interceptMm } = linearRegression(readingsMm.map((r, i) => [r, measuredMm[i]])));
	}
	const degreesOfFreedom = slopeFixed ? n - 1 : n - 2;
	const squares = residualSquares(readingsMm, measuredMm, interceptMm, slope);
	const residualSdMm = Math.sqrt(squares / degreesOfFreedom);
	const tQuantile = jStat.studentt.inv(1 - (1 - METER_UNCERTAINTY_LEVEL) / 2, degreesOfFreedom);
	return {
		n,
		interceptMm,
		slope,
		slopeFixed,
		biasMm,
		residualSdMm,
		degreesOfFreedom,
		tQuantile,
		uncertaintyMm: tQuantile * residualSdMm * Math.sqrt(1 + 1 / n),
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
