/**
 * The check-hole calibration of a cover meter as the engine applies it: measured = a + b·reading
 * by least squares, and the prediction uncertainty of one calibrated reading.
 *
 * Reference for every formula here: the ordinary least squares prediction interval of a new
 * observation, ŷ(x) ± t(1 − α/2; n − 2)·s·√(1 + 1/n + (x − x̄)²/Sxx) (Draper & Smith, Applied
 * Regression Analysis, 3rd ed. 1998, §3.1; Montgomery, Peck & Vining, Introduction to Linear
 * Regression Analysis, §2.5 — both from memory). Checked against scipy 1.17.1 in
 * tests/unit/analysis/meterCalibration.test.ts.
 */
import jStat from 'jstat';
import { linearRegression, mean, sampleStandardDeviation } from 'simple-statistics';
import { MIN_VERIFICATION_HOLES } from './meterVerification';

/**
 * With fewer holes than this the slope is not estimated (b = 1, offset only). Our choice, stated:
 * a slope from 3 or 4 holes leaves 1 or 2 degrees of freedom, and its t quantile (12.7 or 4.30
 * at 95 %) makes the line's prediction interval wider than the offset's it would refine. The
 * same number of holes the verification already calls enough.
 */
export const MIN_SLOPE_HOLES = MIN_VERIFICATION_HOLES;

/** 'line': measured = a + b·reading; 'offset': measured = a + reading (b = 1). */
export type CalibrationModel = 'line' | 'offset';

export interface MeterCalibration {
	model: CalibrationModel;
	/** Check holes. */
	n: number;
	/** a (mm). */
	interceptMm: number;
	/** b (dimensionless); exactly 1 for the offset model. */
	slope: number;
	/** s: √(Σ residual² / ν), mm. */
	residualSdMm: number;
	/** ν = n − 2 for the line, n − 1 for the offset. */
	degreesOfFreedom: number;
	/** r̄, the holes' mean meter reading (mm). */
	meanReadingMm: number;
	/** Sxx = Σ (r − r̄)², mm² (> 0: equal readings are refused). */
	sxxMm2: number;
	/** Two-sided level of the prediction interval. */
	level: number;
	/** t(1 − (1 − level)/2; ν). */
	tQuantile: number;
}

/** A calibration the engine refuses to make or apply; the message is for people. */
export class CalibrationRefused extends Error {
	constructor(message: string) {
		super(message);
		this.name = 'CalibrationRefused';
	}
}

/**
 * Fit the calibration from check holes: meter readings r_i and measured covers m_i (mm). The line
 * measured = a + b·r by least squares (simple-statistics linearRegression) when there are at
 * least MIN_SLOPE_HOLES holes, else the offset a = mean(m − r) with b = 1. Refuses, in words,
 * fewer than 3 holes and holes that all read the same on the meter (Sxx = 0: the calibration
 * cannot be checked across readings). Cost O(n).
 * @example fitCalibration([30, 40, 50, 60, 70], [33, 42, 53, 61, 72]).slope // 0.96
 */
export function fitCalibration(
	readingsMm: readonly number[],
	measuredMm: readonly number[],
	level = 0.95
): MeterCalibration {
	const n = readingsMm.length;
	if (measuredMm.length !== n)
		throw new Error('fitCalibration needs one measured cover per meter reading');
	if (![...readingsMm, ...measuredMm].every(Number.isFinite))
		throw new Error('fitCalibration needs finite meter readings and measured covers');
	if (!(level > 0 && level < 1))
		throw new Error(`fitCalibration needs 0 < level < 1, not ${level}`);
	if (n < 3)
		throw new CalibrationRefused(
			`The calibration needs at least 3 check holes; there ${n === 1 ? 'is' : 'are'} ${n}.`
		);
	if (readingsMm.every((r) => r === readingsMm[0]))
		throw new CalibrationRefused(
			`Every check hole read ${readingsMm[0]} mm on the meter, so the calibration cannot be checked over the range of readings: take holes where the meter reads differently.`
		);
	const meanReadingMm = mean(readingsMm as number[]);
	let sxxMm2 = 0;
	for (const r of readingsMm) sxxMm2 += (r - meanReadingMm) ** 2;
	const model: CalibrationModel = n >= MIN_SLOPE_HOLES ? 'line' : 'offset';
	let interceptMm: number;
	let slope = 1;
	let residualSdMm: number;
	if (model === 'line') {
		({ m: slope, b: interceptMm } = linearRegression(readingsMm.map((r, i) => [r, measuredMm[i]])));
		let squares = 0;
		for (let i = 0; i < n; i++)
			squares += (measuredMm[i] - interceptMm - slope * readingsMm[i]) ** 2;
		residualSdMm = Math.sqrt(squares / (n - 2));
	} else {
		const differences = measuredMm.map((m, i) => m - readingsMm[i]);
		interceptMm = mean(differences);
		residualSdMm = sampleStandardDeviation(differences);
	}
	const degreesOfFreedom = model === 'line' ? n - 2 : n - 1;
	const tQuantile = jStat.studentt.inv(1 - (1 - level) / 2, degreesOfFreedom);
	return {
		model,
		n,
		interceptMm,
		slope,
		residualSdMm,
		degreesOfFreedom,
		meanReadingMm,
		sxxMm2,
		level,
		tQuantile
	};
}

/**
 * Standard error of predicting the measured cover where the meter reads r (mm):
 * s·√(1 + 1/n + (r − r̄)²/Sxx) for the line; s·√(1 + 1/n) for the offset (its one parameter is a
 * mean). Cost O(1).
 */
export function predictionSeMm(calibration: MeterCalibration, readingMm: number): number {
	const { residualSdMm: s, n, model, meanReadingMm, sxxMm2 } = calibration;
	const leverage = model === 'line' ? (readingMm - meanReadingMm) ** 2 / sxxMm2 : 0;
	return s * Math.sqrt(1 + 1 / n + leverage);
}

export interface CalibratedReading {
	/** a + b·r (mm). */
	valueMm: number;
	/** Prediction standard error (mm). */
	seMm: number;
	/** The two-sided prediction interval at the calibration's level (mm). */
	lowerMm: number;
	upperMm: number;
}

/**
 * One meter reading through the calibration, with its prediction interval
 * a + b·r ± t·se(r). Cost O(1).
 * @example calibrateReading(fitCalibration(r, m), 45).lowerMm
 */
export function calibrateReading(
	calibration: MeterCalibration,
	readingMm: number
): CalibratedReading {
	const valueMm = calibration.interceptMm + calibration.slope * readingMm;
	const seMm = predictionSeMm(calibration, readingMm);
	const half = calibration.tQuantile * seMm;
	return { valueMm, seMm, lowerMm: valueMm - half, upperMm: valueMm + half };
}
