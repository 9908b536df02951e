/**
 * Fit both models, test each, say which fits better and warn in words when neither does.
 */
import { andersonDarlingFromProbabilities, type AndersonDarlingResult } from './andersonDarling';
import { fitLognormal, fitNormal, type FittedModel, type ModelName } from './fitModels';
import { kolmogorovSmirnovFromCdf, type KolmogorovSmirnovResult } from './lilliefors';
import { modelProbabilities } from './modelProbabilities';

/** Significance level at which a model is called rejected (common practice: 5 %). */
export const FIT_SIGNIFICANCE = 0.05;

export interface ModelFit extends FittedModel {
	/** Mean and SD of the model in mm (for the lognormal: e^(μ+σ²/2) and its SD). */
	meanMm: number;
	sdMm: number;
	andersonDarling: AndersonDarlingResult | null;
	kolmogorovSmirnov: KolmogorovSmirnovResult | null;
	/** Anderson–Darling p < FIT_SIGNIFICANCE; null with too few readings or none apart (σ = 0). */
	rejected: boolean | null;
}

export interface ModelComparison {
	normal: ModelFit;
	/** null when a reading is 0 mm or less. */
	lognormal: ModelFit | null;
	/** The model with the larger Anderson–Darling p-value (smaller A*² on a tie). */
	better: ModelName;
	significance: number;
	warnings: string[];
}

function testModel(sorted: Float64Array, fit: FittedModel): ModelFit {
	const [meanMm, sdMm] =
		fit.model === 'normal'
			? [fit.location, fit.scale]
			: [
					Math.exp(fit.location + (fit.scale * fit.scale) / 2),
					Math.exp(fit.location + (fit.scale * fit.scale) / 2) *
						Math.sqrt(Math.expm1(fit.scale * fit.scale))
				];
	// Too few readings to test, or every reading equal (σ = 0: a point, nothing to test).
	if (sorted.length < 8 || fit.scale === 0) {
		return { ...fit, meanMm, sdMm, andersonDarling: null, kolmogorovSmirnov: null, rejected: null };
	}
	const probabilities = modelProbabilities(sorted, fit);
	const andersonDarling = andersonDarlingFromProbabilities(probabilities);
	const kolmogorovSmirnov = kolmogorovSmirnovFromCdf(probabilities.cdf);
	const rejected = andersonDarling.pValue < FIT_SIGNIFICANCE;
	return { ...fit, meanMm, sdMm, andersonDarling, kolmogorovSmirnov, rejected };
}

function pText(fit: ModelFit): string {
	const p = fit.andersonDarling?.pValue ?? 0;
	return p < 0.001 ? 'p < 0.001' : `p = ${p.toFixed(3)}`;
}

function fitWarnings(normal: ModelFit, lognormal: ModelFit | null, sorted: Float64Array): string[] {
	const n = sorted.length;
	if (normal.scale === 0) {
		return [
			`All ${n} readings are ${sorted[0]} mm: with no spread no model can be tested, and every ` +
				'figure is that one value.'
		];
	}
	if (normal.rejected === null) {
		return [`Only ${n} readings: too few to test whether a model fits (8 are needed).`];
	}
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

function betterOf(normal: ModelFit, lognormal: ModelFit | null): ModelName {
	if (!lognormal || !normal.andersonDarling || !lognormal.andersonDarling) return 'normal';
	const pn = normal.andersonDarling.pValue;
	const pl = lognormal.andersonDarling.pValue;
	if (pn !== pl) return pl > pn ? 'lognormal' : 'normal';
	return lognormal.andersonDarling.modified < normal.andersonDarling.modified
		? 'lognormal'
		: 'normal';
}

/**
 * Fit normal and lognormal models to sorted readings and test both by Anderson–Darling (which
 * decides) and Kolmogorov–Smirnov/Lilliefors (reported). Cost O(n): one erfc, two logarithms a
 * reading a model. Needs 2 readings; the tests need 8.
 * @example compareModels(sorted).better // 'normal'
 */
export function compareModels(sorted: Float64Array): ModelComparison {
	const normal = testModel(sorted, fitNormal(sorted));
	const lognormal = sorted[0] > 0 ? testModel(sorted, fitLognormal(sorted)) : null;
	return {
		normal,
		lognormal,
		better: betterOf(normal, lognormal),
		significance: FIT_SIGNIFICANCE,
		warnings: fitWarnings(normal, lognormal, sorted)
	};
}
