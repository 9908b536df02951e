/**
 * A population judged through the meter's check-hole calibration, its uncertainty included.
 *
 * Method, in words: where the meter reads r, the measured cover is predicted as a + b·r, and the
 * prediction's own uncertainty is a Student t with ν degrees of freedom and scale
 * se(r) = s·√(1 + 1/n + (r − r̄)²/Sxx) (meterCalibration.ts) — the standard OLS predictive
 * distribution. The population of true covers is therefore the readings' calibrated values, each
 * spread by its own predictive t. Its mean is the mean of a + b·r, and its variance, exactly,
 * is the variance of the calibrated values plus the mean predictive variance
 * V̄ = s²·(1 + 1/n + M₂/Sxx)·ν/(ν − 2), with M₂ the readings' mean squared distance from r̄ (a t
 * with ν ≤ 2 has no variance, so ν > 2 is needed: 4 holes for the offset, 5 for the line).
 * The engine's methods then judge the calibrated values with their deviations from the mean
 * stretched by λ = √(1 + V̄/s_c²), s_c the calibrated values' SD: mean and SD are then exactly
 * those of the predictive population, so the normal-model methods (model, prediction,
 * tolerance) and the share below c_min under the normal model are exact; the shape (the
 * empirical percentile, counts below c_min, the lognormal) is kept from the readings, which is
 * the approximation. The same parameter uncertainty is what EN 1990 Annex D's prediction method
 * carries as √(1 + 1/n). Beside it, the exact predictive share below c_min: the mean over the
 * readings of F_ν((c_min − a − b·r)/se(r)).
 * Both are one straight line of the readings, so on counts the grid is mapped, not expanded.
 */
import jStat from 'jstat';
import type { AssessOptions } from './assessOptions';
import { assessPopulationCounted, type PopulationAssessment } from './assessPopulation';
import { countedFromSorted, mapCounted, momentsCounted, type CountedSample } from './countedSample';
import { CalibrationRefused, predictionSeMm, type MeterCalibration } from './meterCalibration';
import { toSortedCovers } from './readings';
import { detectResolutionOfDistinctMm } from './resolution';
import type { CoverRequirement } from './requirements/requirement';

/** Readings as given, or held as counts of distinct values. */
export type CoverSampleInput = readonly number[] | Float64Array | CountedSample;

function asCounted(input: CoverSampleInput): CountedSample {
	if ('counts' in input) return input;
	return countedFromSorted(toSortedCovers(input));
}

export interface CalibratedSpread {
	/** The judged covers are intercept + slope·reading (mm); the point calibration stretched by λ. */
	interceptMm: number;
	slope: number;
	/** λ = √(1 + V̄/s_c²). */
	stretch: number;
	/** V̄, mean predictive variance of one calibrated reading (mm²). */
	predictiveVarianceMm2: number;
	/** Mean of a + b·r over the readings (mm). */
	calibratedMeanMm: number;
	/** s_c, SD of a + b·r over the readings (mm). */
	calibratedSdMm: number;
	/** √(s_c² + V̄), the SD the methods judge (mm). */
	judgedSdMm: number;
}

/**
 * The straight line that turns readings into the covers judged with the calibration's
 * uncertainty (see the file's method). Takes readings or counts. Cost O(D) on D distinct values
 * (O(N) to count raw readings). Refuses, in words: ν ≤ 2, readings with no spread, a falling
 * line, a calibrated cover below 0 mm.
 */
export function calibratedSpread(
	input: CoverSampleInput,
	calibration: MeterCalibration
): CalibratedSpread {
	const sample = asCounted(input);
	const { interceptMm: a, slope: b, degreesOfFreedom: nu, n, residualSdMm: s } = calibration;
	if (nu <= 2)
		throw new CalibrationRefused(
			`${n} check holes leave ${nu} degrees of freedom, and a t distribution with ${nu} has no finite variance: at least ${calibration.model === 'line' ? 5 : 4} holes are needed to apply the calibration.`
		);
	if (!(b > 0))
		throw new CalibrationRefused(
			`The calibration line falls or is flat (b = ${b.toFixed(3)}): the meter readings do not follow the measured cover, so it is not applied.`
		);
	const { mean: readingMean, sd: readingSd, n: count } = momentsCounted(sample);
	if (count < 2 || !(readingSd > 0))
		throw new CalibrationRefused(
			'The readings have no spread, so the calibration uncertainty cannot be spread over them.'
		);
	let m2 = 0;
	if (calibration.model === 'line') {
		for (let i = 0; i < sample.values.length; i++)
			m2 += sample.counts[i] * (sample.values[i] - calibration.meanReadingMm) ** 2;
		m2 /= count;
	}
	const leverage = calibration.model === 'line' ? m2 / calibration.sxxMm2 : 0;
	const predictiveVarianceMm2 = s * s * (1 + 1 / n + leverage) * (nu / (nu - 2));
	const calibratedMeanMm = a + b * readingMean;
	const calibratedSdMm = b * readingSd;
	const stretch = Math.sqrt(1 + predictiveVarianceMm2 / (calibratedSdMm * calibratedSdMm));
	const spread = {
		interceptMm: calibratedMeanMm * (1 - stretch) + stretch * a,
		slope: stretch * b,
		stretch,
		predictiveVarianceMm2,
		calibratedMeanMm,
		calibratedSdMm,
		judgedSdMm: Math.sqrt(calibratedSdMm ** 2 + predictiveVarianceMm2)
	};
	const lowest = spread.interceptMm + spread.slope * sample.values[0];
	if (lowest < 0)
		throw new CalibrationRefused(
			`Through the calibration the lowest reading (${sample.values[0]} mm) would be below 0 mm (${lowest.toFixed(1)} mm), so it is not applied.`
		);
	return spread;
}

/** Readings through the line of calibratedSpread, as Float64Array (raw) or counts (grid mapped). */
export function applySpread(
	input: readonly number[] | Float64Array,
	spread: CalibratedSpread
): Float64Array;
export function applySpread(input: CountedSample, spread: CalibratedSpread): CountedSample;
export function applySpread(
	input: CoverSampleInput,
	spread: CalibratedSpread
): Float64Array | CountedSample {
	if ('counts' in input) return mapCounted(input, spread.interceptMm, spread.slope);
	const out = new Float64Array(input.length);
	for (let i = 0; i < out.length; i++) out[i] = spread.interceptMm + spread.slope * input[i];
	return out;
}

/**
 * Exact predictive share of the population below a limit (mm): the mean over the readings of
 * F_ν((limit − a − b·r)/se(r)), F_ν the Student t CDF; a zero se counts a reading as below when
 * a + b·r < limit. Takes readings or counts. Cost O(D) t CDFs on D distinct values.
 * @example predictiveShareBelow([40, 45, 50], calibration, 35)
 */
export function predictiveShareBelow(
	input: CoverSampleInput,
	calibration: MeterCalibration,
	limitMm: number
): number {
	const sample = asCounted(input);
	const { interceptMm: a, slope: b, degreesOfFreedom: nu } = calibration;
	let below = 0;
	for (let i = 0; i < sample.values.length; i++) {
		const centre = a + b * sample.values[i];
		const se = predictionSeMm(calibration, sample.values[i]);
		const share =
			se > 0 ? jStat.studentt.cdf((limitMm - centre) / se, nu) : centre < limitMm ? 1 : 0;
		below += sample.counts[i] * share;
	}
	return below / sample.n;
}

export interface CalibratedAssessment {
	calibration: MeterCalibration;
	spread: CalibratedSpread;
	/** The chosen rule set, method and model on the covers of calibratedSpread. */
	assessment: PopulationAssessment;
	/** predictiveShareBelow at c_min. */
	predictiveShareBelowCMin: number;
}

/**
 * Assess a population (raw readings or counts, mm) through the calibration with its
 * uncertainty: the readings mapped by calibratedSpread (on counts the grid is mapped, not
 * expanded) and judged by the counted assessment with the same options. Cost: the counted
 * assessment's plus O(D). Throws CalibrationRefused with a message for people.
 */
export function assessCalibrated(
	input: CoverSampleInput,
	calibration: MeterCalibration,
	requirement: CoverRequirement,
	options: AssessOptions = {}
): CalibratedAssessment {
	const sample = asCounted(input);
	const spread = calibratedSpread(sample, calibration);
	// The meter's grid, stretched by the line, keeps the grouped fit test on the same classes.
	const meterStepMm = detectResolutionOfDistinctMm(sample.values, sample.n);
	const gridStepMm = meterStepMm === null ? null : meterStepMm * spread.slope;
	return {
		calibration,
		spread,
		assessment: assessPopulationCounted(applySpread(sample, spread), requirement, {
			...options,
			gridStepMm
		}),
		predictiveShareBelowCMin: predictiveShareBelow(sample, calibration, requirement.cMinMm)
	};
}

/** The method of assessCalibrated for people (pages, API, report). */
export const CALIBRATION_METHOD_WORDS =
	'Each reading r is replaced by the cover the check holes predict, a + b·r, fitted by least ' +
	'squares (with fewer than 5 holes only the offset a is fitted and b = 1). The prediction of one ' +
	'cover is uncertain: a Student t with the calibration’s degrees of freedom and standard error ' +
	's·√(1 + 1/n + (r − r̄)²/Sxx), the textbook prediction interval. Its variance is added to the ' +
	'spread of the calibrated covers, so the population judged has the mean of the calibrated covers ' +
	'and the standard deviation √(s_c² + V), V the mean prediction variance; the chosen rule set, ' +
	'method and model then judge it as any population. The normal-model figures are exact for that ' +
	'mean and spread; the empirical figures keep the shape of the readings. Beside it, the predicted ' +
	'share below c_min is the mean over the readings of the chance that each one’s cover is below.';

/**
 * The calibration line and what its uncertainty does to the spread, in one sentence, for the
 * detail page, a saved assessment and the report alike. Lengths as "0.13 mm", 2 decimals.
 */
export function calibrationLineWords(c: CalibratedAssessment): string {
	const line = c.calibration;
	const mm2 = (v: number) => `${v.toFixed(2)} mm`;
	const offset = `${line.interceptMm < 0 ? '−' : '+'} ${mm2(Math.abs(line.interceptMm))}`;
	const equation =
		line.model === 'line'
			? `measured = ${line.slope.toFixed(3)} × reading ${offset}`
			: `measured = reading ${offset} (offset only: fewer than 5 holes)`;
	return (
		`From ${line.n} check holes: ${equation}; residual SD ${mm2(line.residualSdMm)} with ` +
		`${line.degreesOfFreedom} degrees of freedom (t = ${line.tQuantile.toFixed(2)} at ` +
		`${Math.round(line.level * 100)} %). Adding the mean prediction variance ` +
		`${c.spread.predictiveVarianceMm2.toFixed(2)} mm² turns the calibrated covers’ SD ` +
		`${mm2(c.spread.calibratedSdMm)} into ${mm2(c.spread.judgedSdMm)}.`
	);
}
