/**
 * The one entry: assess a cover population against a requirement.
 */
import { type ResolvedOptions, type AssessOptions, resolveOptions } from './assessOptions';
import {
	characteristicCovers,
	judgedCharacteristic,
	type CharacteristicCovers
} from './characteristicCover';
import { chartData, type ChartData } from './charts';
import { type CoverDescription, describeSorted } from './describe';
import type { ModelName } from './fitModels';
import { fractionBelow, type FractionBelow } from './fractionBelow';
import { compareModels, type ModelComparison } from './goodnessOfFit';
import { percentileSorted } from './percentile';
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
 * options used and ENGINE_VERSION. Cost: one sort O(n log n), then O(n) (≈ 3 passes and one
 * erfc + two logarithms a reading a model). Needs 2 readings.
 * @example assessPopulation(readingsMm, enRequirement({ exposureClass: 'XC3', barDiameterMm: 12 })).verdict
 */
export function assessPopulation(
	coversMm: readonly number[] | Float64Array,
	requirement: CoverRequirement,
	options: AssessOptions = {}
): PopulationAssessment {
	requireReadings('assessPopulation', coversMm.length, 2);
	const resolved = resolveOptions(requirement, options);
	const fullRequirement = { ...requirement, allowedFractionBelow: allowedFractionOf(requirement) };
	const sorted = toSortedCovers(coversMm);
	const description = describeSorted(sorted, resolved.percentileType);
	const models = compareModels(sorted, options.gridStepMm ?? null);
	const chosenModel = chooseModel(resolved, models);
	const { fractileP: p, confidence, percentileType: type } = resolved;
	const characteristic = characteristicCovers(
		sorted,
		models.normal,
		models.lognormal,
		p,
		confidence,
		type
	);
	const fractionBelowCMin = fractionBelow(
		sorted,
		requirement.cMinMm,
		models.normal,
		models.lognormal,
		confidence
	);
	const ruleResult = runRuleSet(resolved.ruleSet, {
		sorted,
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
			valueMm: percentileSorted(sorted, q, type)
		})),
		models,
		chosenModel,
		characteristic: { ...characteristic, chosenMm: judged.valueMm, chosenBasis: judged.basis },
		fractionBelowCMin,
		...ruleResult,
		warnings: sampleWarnings(description.n, resolved, models),
		charts: resolved.charts ? chartData(sorted, fits, resolved.binWidthMm ?? undefined) : null
	});
}
