/**
 * Fit both models, test each, say which fits better and warn in words when neither does.
 */
import { andersonDarlingFromProbabilities, type AndersonDarlingResult } from './andersonDarling';
import { fitLognormal, fitNormal, type FittedModel, type ModelName } from './fitModels';
import { kolmogorovSmirnovFromCdf, type KolmogorovSmirnovResult } from './lilliefors';
import {
	andersonDarlingCounted,
	type CountedSample,
	fitLognormalCounted,
	fitNormalCounted,
	kolmogorovSmirnovCounted
} from './countedSample';
import { groupedChiSquare, groupedChiSquareFromCounts, type GroupedFitResult } from './groupedFit';
import { modelProbabilities } from './modelProbabilities';
import { detectResolutionMm, detectResolutionOfDistinctMm } from './resolution';

/** Significance level at which a model is called rejected (common practice: 5 %). */
export const FIT_SIGNIFICANCE = 0.05;

export interface ModelFit extends FittedModel {
	/** Mean and SD of the model in mm (for the lognormal: e^(μ+σ²/2) and its SD). */
	meanMm: number;
	sdMm: number;
	andersonDarling: AndersonDarlingResult | null;
	kolmogorovSmirnov: KolmogorovSmirnovResult | null;
	/** Chi-square over the meter's classes; null when no resolution was detected. */
	grouped: GroupedFitResult | null;
	/**
	 * The test that decides: Anderson–Darling for continuous readings; the grouped chi-square
	 * when the readings sit on the meter's grid with ties (Anderson–Darling assumes no ties).
	 */
	decidedBy: 'anderson-darling' | 'grouped-chi-square' | null;
	/** The deciding test's p < FIT_SIGNIFICANCE; null when it cannot be tested (too few
	 * readings, no spread, or too few distinct values). */
	rejected: boolean | null;
}

export interface ModelComparison {
	normal: ModelFit;
	/** null when a reading is 0 mm or less. */
	lognormal: ModelFit | null;
	/** The model with the larger p-value of the deciding test (smaller A*² on a tie). */
	better: ModelName;
	/** The meter's step detected in the readings (1, 0.5 or 0.1 mm), or null. */
	resolutionMm: number | null;
	significance: number;
	warnings: string[];
}

function untestedFit(fit: FittedModel): ModelFit {
	const [meanMm, sdMm] =
		fit.model === 'normal'
			? [fit.location, fit.scale]
			: [
					Math.exp(fit.location + (fit.scale * fit.scale) / 2),
					Math.exp(fit.location + (fit.scale * fit.scale) / 2) *
						Math.sqrt(Math.expm1(fit.scale * fit.scale))
				];
	return {
		...fit,
		meanMm,
		sdMm,
		andersonDarling: null,
		kolmogorovSmirnov: null,
		grouped: null,
		decidedBy: null,
		rejected: null
	};
}

function decide(
	untested: ModelFit,
	andersonDarling: AndersonDarlingResult,
	kolmogorovSmirnov: KolmogorovSmirnovResult,
	grouped: GroupedFitResult | null
): ModelFit {
	const decidedBy = grouped ? 'grouped-chi-square' : 'anderson-darling';
	const p = grouped ? grouped.pValue : andersonDarling.pValue;
	const rejected = p === null ? null : p < FIT_SIGNIFICANCE;
	return { ...untested, andersonDarling, kolmogorovSmirnov, grouped, decidedBy, rejected };
}

function testModel(sorted: Float64Array, fit: FittedModel, resolutionMm: number | null): ModelFit {
	const untested = untestedFit(fit);
	// Too few readings to test, or every reading equal (σ = 0: a point, nothing to test).
	if (sorted.length < 8 || fit.scale === 0) return untested;
	const probabilities = modelProbabilities(sorted, fit);
	return decide(
		untested,
		andersonDarlingFromProbabilities(probabilities),
		kolmogorovSmirnovFromCdf(probabilities.cdf),
		resolutionMm === null ? null : groupedChiSquare(sorted, fit, resolutionMm)
	);
}

function decidingP(fit: ModelFit): number | null {
	return fit.decidedBy === 'grouped-chi-square'
		? (fit.grouped?.pValue ?? null)
		: (fit.andersonDarling?.pValue ?? null);
}

function pText(fit: ModelFit): string {
	const p = decidingP(fit) ?? 0;
	return p < 0.001 ? 'p < 0.001' : `p = ${p.toFixed(3)}`;
}

const pWords = (p: number) => (p < 0.001 ? 'p < 0.001' : `p = ${p.toFixed(3)}`);
const NAMES: Record<ModelName, string> = { normal: 'normal', lognormal: 'lognormal' };

/** "Ties alone": Anderson–Darling rejects a model that the grouped test keeps. */
function tieSentences(fits: (ModelFit | null)[], resolutionMm: number): string[] {
	return fits.flatMap((fit) => {
		if (!fit?.grouped || fit.grouped.pValue === null || !fit.andersonDarling) return [];
		if (fit.andersonDarling.pValue >= FIT_SIGNIFICANCE || fit.rejected) return [];
		return [
			`Anderson–Darling would reject the ${NAMES[fit.model]} model (${pWords(fit.andersonDarling.pValue)}) ` +
				`for the ties alone: the meter logs in steps of ${resolutionMm} mm, and a chi-square test over ` +
				`${resolutionMm} mm classes keeps it (${pWords(fit.grouped.pValue)}).`
		];
	});
}

function fitWarnings(
	normal: ModelFit,
	lognormal: ModelFit | null,
	n: number,
	minMm: number
): string[] {
	const resolutionMm = normal.grouped?.resolutionMm ?? null;
	if (normal.scale === 0) {
		return [
			`All ${n} readings are ${minMm} mm: with no spread no model can be tested, and every ` +
				'figure is that one value.'
		];
	}
	if (normal.rejected === null && n < 8) {
		return [`Only ${n} readings: too few to test whether a model fits (8 are needed).`];
	}
	if (normal.rejected === null) {
		// Near-constant: so few distinct values on the meter's grid that no shape can be tested.
		return [
			`The readings take only ${normal.grouped?.classes ?? 'a few'} classes at the meter's ` +
				`resolution of ${resolutionMm} mm: too few to test the shape of a model, so none is ` +
				'rejected and no mixture is suspected.'
		];
	}
	const ties = resolutionMm === null ? [] : tieSentences([normal, lognormal], resolutionMm);
	return [...ties, ...shapeWarnings(normal, lognormal)];
}

function shapeWarnings(normal: ModelFit, lognormal: ModelFit | null): string[] {
	if (lognormal === null) {
		const tail = normal.rejected ? ` The normal model does not fit either (${pText(normal)}).` : '';
		return [`The lognormal model was not fitted because a reading is 0 mm or less.${tail}`];
	}
	if (normal.rejected && lognormal.rejected) {
		return [
			`Neither the normal (${pText(normal)}) nor the lognormal model (${pText(lognormal)}) fits ` +
				'these readings: they may be two populations, for example a patch of low cover. ' +
				'Rely on the empirical figures and look for the low patch on the map.'
		];
	}
	if (normal.rejected) {
		return [`The normal model does not fit these readings (${pText(normal)}); the lognormal does.`];
	}
	if (lognormal.rejected) {
		return [
			`The lognormal model does not fit these readings (${pText(lognormal)}); the normal does.`
		];
	}
	return [];
}

/** Within 1e-9 relative: closer than any two sums of the same data can be told apart. */
function roughlyEqual(a: number, b: number): boolean {
	return Math.abs(a - b) <= 1e-9 * Math.max(Math.abs(a), Math.abs(b));
}

function betterOf(normal: ModelFit, lognormal: ModelFit | null): ModelName {
	if (!lognormal) return 'normal';
	const pn = decidingP(normal);
	const pl = decidingP(lognormal);
	if (pn === null || pl === null || !normal.andersonDarling || !lognormal.andersonDarling)
		return 'normal';
	// Equal to rounding is a tie: with two distinct values, say, both models give one A² in exact
	// arithmetic, and which sum rounds lower must not pick the model.
	if (!roughlyEqual(pn, pl)) return pl > pn ? 'lognormal' : 'normal';
	const an = normal.andersonDarling.modified;
	const al = lognormal.andersonDarling.modified;
	return !roughlyEqual(an, al) && al < an ? 'lognormal' : 'normal';
}

/**
 * The meter's step when the readings sit on its grid with ties; null for continuous readings.
 * A known step (readings through a calibration line sit on the meter's grid stretched by the
 * slope, which does not start at 0 mm) is taken as given.
 */
function groupedResolution(sorted: Float64Array, knownStepMm: number | null = null): number | null {
	const step = knownStepMm ?? detectResolutionMm(sorted);
	if (step === null) return null;
	for (let i = 1; i < sorted.length; i++) if (sorted[i] === sorted[i - 1]) return step;
	return null;
}

/**
 * Fit normal and lognormal models to sorted readings and test both by Anderson–Darling (which
 * decides for continuous readings) and Kolmogorov–Smirnov/Lilliefors (reported); when the
 * readings sit on a meter's grid (1, 0.5 or 0.1 mm) with ties, a chi-square over the grid's
 * classes decides instead and the warnings say when ties alone made Anderson–Darling reject. Cost O(n): one erfc, two logarithms a
 * reading a model. Needs 2 readings; the tests need 8.
 * @example compareModels(sorted).better // 'normal'
 */
export function compareModels(
	sorted: Float64Array,
	knownStepMm: number | null = null
): ModelComparison {
	const resolutionMm = groupedResolution(sorted, knownStepMm);
	const normal = testModel(sorted, fitNormal(sorted), resolutionMm);
	const lognormal = sorted[0] > 0 ? testModel(sorted, fitLognormal(sorted), resolutionMm) : null;
	return {
		normal,
		lognormal,
		better: betterOf(normal, lognormal),
		resolutionMm,
		significance: FIT_SIGNIFICANCE,
		warnings: fitWarnings(normal, lognormal, sorted.length, sorted[0])
	};
}

/**
 * compareModels of a population held as counts (analysis/countedSample.ts): the same fits,
 * tests, choice and warnings, each test summed a run of equal readings at a time. Cost O(D)
 * for D distinct values, whatever the number of readings. A known step is taken as given, as
 * in compareModels.
 */
export function compareModelsCounted(
	sample: CountedSample,
	knownStepMm: number | null = null
): ModelComparison {
	const { values, counts, n } = sample;
	let tied = false;
	for (let i = 0; i < counts.length && !tied; i++) tied = counts[i] > 1;
	const step = knownStepMm ?? detectResolutionOfDistinctMm(values, n);
	const resolutionMm = step !== null && tied ? step : null;
	const test = (fit: FittedModel): ModelFit => {
		const untested = untestedFit(fit);
		if (n < 8 || fit.scale === 0) return untested;
		const uppers = resolutionMm === null ? null : values.map((v) => v + resolutionMm / 2);
		// One pass of the model's CDF over the distinct values serves both tests.
		const probabilities = modelProbabilities(values, fit);
		return decide(
			untested,
			andersonDarlingCounted(sample, fit, probabilities),
			kolmogorovSmirnovCounted(sample, fit, probabilities),
			uppers && resolutionMm !== null
				? groupedChiSquareFromCounts(uppers, counts, n, fit, resolutionMm)
				: null
		);
	};
	const normal = test(fitNormalCounted(sample));
	const lognormal = values[0] > 0 ? test(fitLognormalCounted(sample)) : null;
	return {
		normal,
		lognormal,
		better: betterOf(normal, lognormal),
		resolutionMm,
		significance: FIT_SIGNIFICANCE,
		warnings: fitWarnings(normal, lognormal, n, values[0])
	};
}
