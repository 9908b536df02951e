/**
 * Characteristic (lower fractile) cover by every method the engine offers.
 */
import { predictionFactor, toleranceFactor } from './characteristicFactors';
import type { FittedModel, ModelName } from './fitModels';
import { modelQuantile } from './fitModels';
import { normalQuantile } from './normalDistribution';
import { percentileSorted, type PercentileType } from './percentile';
import { requireOpenUnit, requireReadings } from './readings';

/** 'empirical' percentile; 'model' μ − z·σ; 'prediction' EN 1990 D7.2; 'tolerance' ISO 16269-6. */
export type CharacteristicMethod = 'empirical' | 'model' | 'prediction' | 'tolerance';

export interface ModelCharacteristic {
	/** μ − z(1−p)·σ (on ln x for the lognormal, then e^·), mm. */
	modelMm: number;
	/** μ − k_n·σ, EN 1990 Annex D prediction method, V_x unknown, mm. */
	predictionMm: number;
	/** μ − k·σ, one-sided tolerance limit covering 1 − p at confidence γ, mm. */
	toleranceMm: number;
}

export interface CharacteristicCovers {
	p: number;
	confidence: number;
	empiricalMm: number;
	predictionFactor: number;
	toleranceFactor: number;
	normal: ModelCharacteristic;
	lognormal: ModelCharacteristic | null;
}

function forModel(fit: FittedModel, z: number, kn: number, k: number): ModelCharacteristic {
	return {
		modelMm: modelQuantile(fit, -z),
		predictionMm: modelQuantile(fit, -kn),
		toleranceMm: modelQuantile(fit, -k)
	};
}

/**
 * Characteristic cover at the lower fractile p by every method.
 *
 * Empirical: percentile p of the chosen type. Normal/lognormal: x_p = μ − z(1−p)·σ.
 * Prediction (EN 1990 D7.2): μ − k_n·σ, k_n = t(1−p; n−1)·√(1 + 1/n).
 * Tolerance (ISO 16269-6): μ − k·σ with k from the noncentral t at confidence γ.
 * Units mm. Cost O(1) on sorted data plus ≈ 10 noncentral t CDFs. Needs 2 readings.
 * @example characteristicCovers(sorted, normalFit, lognormalFit, 0.05, 0.95).normal.toleranceMm
 */
export function characteristicCovers(
	sorted: Float64Array,
	normal: FittedModel,
	lognormal: FittedModel | null,
	p = 0.05,
	confidence = 0.95,
	type: PercentileType = 7
): CharacteristicCovers {
	requireReadings('characteristicCovers', sorted.length, 2);
	return characteristicCoversFromFactors(
		sorted.length,
		percentileSorted(sorted, p, type),
		normal,
		lognormal,
		p,
		confidence
	);
}

/**
 * characteristicCovers from n and the empirical percentile (the rest depends on the fits and
 * n only), shared with the counted form (countedSample.ts).
 */
export function characteristicCoversFromFactors(
	n: number,
	empiricalMm: number,
	normal: FittedModel,
	lognormal: FittedModel | null,
	p = 0.05,
	confidence = 0.95
): CharacteristicCovers {
	requireReadings('characteristicCovers', n, 2);
	requireOpenUnit('characteristicCovers', 'confidence', confidence);
	const z = normalQuantile(1 - p);
	const kn = predictionFactor(n, p);
	const k = toleranceFactor(n, p, confidence);
	return {
		p,
		confidence,
		empiricalMm,
		predictionFactor: kn,
		toleranceFactor: k,
		normal: forModel(normal, z, kn, k),
		lognormal: lognormal ? forModel(lognormal, z, kn, k) : null
	};
}

/** The one characteristic cover a rule uses: method × model (empirical ignores the model). */
export function chosenCharacteristicMm(
	covers: CharacteristicCovers,
	method: CharacteristicMethod,
	model: ModelName
): number {
	if (method === 'empirical') return covers.empiricalMm;
	const figures = model === 'lognormal' && covers.lognormal ? covers.lognormal : covers.normal;
	if (method === 'model') return figures.modelMm;
	return method === 'prediction' ? figures.predictionMm : figures.toleranceMm;
}

const METHOD_WORDS: Record<CharacteristicMethod, string> = {
	empirical: 'empirical percentile',
	model: 'fitted model quantile',
	prediction: 'prediction method (EN 1990 D7.2)',
	tolerance: 'tolerance limit (ISO 16269-6)'
};

export interface JudgedCharacteristic {
	/** The value the characteristic rule judges and the pages show as the headline, mm. */
	valueMm: number;
	/** True when the model was rejected and the lower empirical percentile was taken. */
	empiricalTaken: boolean;
	/** How the value was obtained, in words. */
	basis: string;
}

/**
 * The one characteristic cover a population is judged by: the chosen method and model, except
 * that a model the goodness-of-fit test rejected must not flatter the population, so the lower
 * of the model's figure and the empirical percentile counts (common practice: a rejected model
 * is not extrapolated into the tail it failed to describe). The rule, the headline, the chart
 * line and the report all read this one value.
 */
export function judgedCharacteristic(
	covers: CharacteristicCovers,
	method: CharacteristicMethod,
	model: ModelName,
	modelRejected: boolean
): JudgedCharacteristic {
	const chosen = chosenCharacteristicMm(covers, method, model);
	const rejected = method !== 'empirical' && modelRejected;
	const empiricalTaken = rejected && covers.empiricalMm < chosen;
	const methodWords =
		method === 'empirical' ? METHOD_WORDS.empirical : `${METHOD_WORDS[method]}, ${model} model`;
	const basis = !rejected
		? methodWords
		: empiricalTaken
			? `empirical percentile: the ${model} model was rejected and its ${METHOD_WORDS[method]} figure was higher`
			: `${methodWords} (the model was rejected, but its figure is already the lower)`;
	return { valueMm: empiricalTaken ? covers.empiricalMm : chosen, empiricalTaken, basis };
}
