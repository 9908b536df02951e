/**
 * The one entry: assess a cover population against a requirement.
 */
import { type ResolvedOptions, type AssessOptions, resolveOptions } from './assessOptions';
import { judgedCharacteristic, type CharacteristicCovers } from './characteristicCover';
import { chartDataCounted, type ChartData } from './charts';
import {
	characteristicCoversCounted,
	type CountedSample,
	countedFromSorted,
	describeCounted,
	fractionBelowCounted,
	percentileCounted
} from './countedSample';
import type { CoverDescription } from './describe';
import type { ModelName } from './fitModels';
import type { FractionBelow } from './fractionBelow';
import { compareModelsCounted, type ModelComparison } from './goodnessOfFit';
import { requireReadings, toSortedCovers } from './readings';
import { allowedFractionOf, type CoverRequirement } from './requirements/requirement';
import { runRuleSet, type RuleSetResult } from './rules/ruleSets';
import { toPlainJson } from './plainJson';
import { ENGINE_VERSION } from './version';

export interface PopulationAssessment extends RuleSetResult {
	engineVersion: string;
	options: ResolvedOptions;
	requirement: CoverRequirement;
	description: CoverDescription;
	percentiles: { p: number; valueMm: number }[];
	models: ModelComparison;
	/** The model the characteristic rule used. */
	chosenModel: ModelName;
	/**
	 * chosenMm is the value the characteristic rule judges (judgedCharacteristic), and
	 * chosenBasis says in words how it was obtained.
	 */
	characteristic: CharacteristicCovers & { chosenMm: number; chosenBasis: string };
	fractionBelowCMin: FractionBelow;
	/** Plain-language warnings (model fit, small samples). */
	warnings: string[];
	charts: ChartData | null;
}

function chooseModel(options: ResolvedOptions, models: ModelComparison): ModelName {
	if (options.model === 'best-fit') return models.better;
	return options.model === 'lognormal' && models.lognormal ? 'lognormal' : 'normal';
}

function sampleWarnings(n: number, options: ResolvedOptions, models: ModelComparison): string[] {
	const out = [...models.warnings];
	if (n < options.minSampleSize) {
		out.push(`Only ${n} readings: the statistical checks need at least ${options.minSampleSize}.`);
	}
	if (options.model === 'lognormal' && !models.lognormal) {
		out.push('The lognormal model was asked for but cannot be fitted; the normal model was used.');
	}
	return out;
}

/**
 * Assess a population of cover readings (mm) against a requirement: describe, fit and test
 * both models, characteristic cover by every method, fraction below c_min with intervals, and
 * the chosen rule set. Returns plain JSON (no typed arrays, no NaN/Infinity) carrying the
 * options used and ENGINE_VERSION. The readings are sorted and counted (O(n log n), O(n) when
 * already in order) and judged by assessPopulationCounted, so a raw array and its stored counts
 * take one code path and give one answer. Needs 2 readings.
 * @example assessPopulation(readingsMm, enRequirement({ exposureClass: 'XC3', barDiameterMm: 12 })).verdict
 */
export function assessPopulation(
	coversMm: readonly number[] | Float64Array,
	requirement: CoverRequirement,
	options: AssessOptions = {}
): PopulationAssessment {
	requireReadings('assessPopulation', coversMm.length, 2);
	return assessPopulationCounted(countedFromSorted(toSortedCovers(coversMm)), requirement, options);
}

/**
 * assessPopulation of a population held as counts (analysis/countedSample.ts): every figure
 * from the distinct values and their counts — order statistics and counts to the bit, sums from
 * whole numbers on the meter's grid, the tests summed a run of equal readings at a time
 * (tests/unit/analysis/countedAssessment.test.ts checks each figure against the engine's
 * functions on the readings expanded). Cost O(D) for D distinct values, ≈ one erfc and two
 * logarithms a distinct value a model, whatever the number of readings. Needs 2 readings.
 */
export function assessPopulationCounted(
	sample: CountedSample,
	requirement: CoverRequirement,
	options: AssessOptions = {}
): PopulationAssessment {
	requireReadings('assessPopulation', sample.n, 2);
	const resolved = resolveOptions(requirement, options);
	const fullRequirement = { ...requirement, allowedFractionBelow: allowedFractionOf(requirement) };
	const description = describeCounted(sample, resolved.percentileType);
	const models = compareModelsCounted(sample, options.gridStepMm ?? null);
	const chosenModel = chooseModel(resolved, models);
	const { fractileP: p, confidence, percentileType: type } = resolved;
	const characteristic = characteristicCoversCounted(
		sample,
		models.normal,
		models.lognormal,
		p,
		confidence,
		type
	);
	const fractionBelowCMin = fractionBelowCounted(
		sample,
		requirement.cMinMm,
		models.normal,
		models.lognormal,
		confidence
	);
	const ruleResult = runRuleSet(resolved.ruleSet, {
		sample,
		description,
		models,
		characteristic,
		fractionBelowCMin,
		requirement: fullRequirement,
		method: resolved.characteristicMethod,
		model: chosenModel,
		minSampleSize: resolved.minSampleSize,
		percentileType: type,
		unit: resolved.displayUnit
	});
	// A model with no spread (every reading equal) has no curve to draw.
	const fits = [models.normal, models.lognormal].filter(
		(fit): fit is NonNullable<typeof fit> => fit !== null && fit.scale > 0
	);
	const chosenFit = chosenModel === 'lognormal' ? models.lognormal : models.normal;
	const judged = judgedCharacteristic(
		characteristic,
		resolved.characteristicMethod,
		chosenModel,
		chosenFit?.rejected === true
	);
	return toPlainJson({
		engineVersion: ENGINE_VERSION,
		options: resolved,
		requirement: fullRequirement,
		description,
		percentiles: resolved.percentiles.map((q) => ({
			p: q,
			valueMm: percentileCounted(sample, q, type)
		})),
		models,
		chosenModel,
		characteristic: { ...characteristic, chosenMm: judged.valueMm, chosenBasis: judged.basis },
		fractionBelowCMin,
		...ruleResult,
		warnings: sampleWarnings(description.n, resolved, models),
		charts: resolved.charts
			? chartDataCounted(sample, fits, resolved.binWidthMm ?? undefined)
			: null
	});
}
