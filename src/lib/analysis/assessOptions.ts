/**
 * Options of an assessment, with their defaults. The resolved options go into the result so a
 * stored snapshot can be reproduced.
 */
import type { CharacteristicMethod } from './characteristicCover';
import type { PercentileType } from './percentile';
import type { CoverRequirement } from './requirements/requirement';
import { defaultRuleSet, RULE_SETS, type RuleSetName } from './rules/ruleSets';
import type { LengthUnit } from './units';

export type ModelChoice = 'normal' | 'lognormal' | 'best-fit';
const MODEL_CHOICES: readonly ModelChoice[] = ['normal', 'lognormal', 'best-fit'];
const METHODS: readonly CharacteristicMethod[] = ['empirical', 'model', 'prediction', 'tolerance'];

export interface AssessOptions {
	/** Lower fractile p of the characteristic cover (default 0.05). */
	fractileP?: number;
	/** Confidence γ of intervals, bounds and the tolerance limit (default 0.95). */
	confidence?: number;
	/** Hyndman–Fan type (default 7). */
	percentileType?: PercentileType;
	/** Model for the characteristic rule (default 'best-fit': the better Anderson–Darling fit). */
	model?: ModelChoice;
	/** Characteristic method of the rule (default 'prediction', EN 1990 Annex D). */
	characteristicMethod?: CharacteristicMethod;
	/** Rule set (default 'en-statistical', or 'aci-tolerance' for ACI requirements). */
	ruleSet?: RuleSetName;
	/** Minimum readings for each statistical rule (default 20). */
	minSampleSize?: number;
	/** Percentiles to report (default 5, 10, 25, 50, 75, 90, 95 %). */
	percentiles?: readonly number[];
	/** Unit of the sentences in rule reasons (default 'mm'; figures stay in mm). */
	displayUnit?: LengthUnit;
	/** Include chart data (default false, so overviews of many groups stay cheap). */
	charts?: boolean;
	/** Fixed histogram bin width (mm) instead of Freedman–Diaconis. */
	binWidthMm?: number | null;
	/**
	 * The grid step of readings that lie on a meter's grid not anchored at 0 mm (readings through
	 * a calibration line: the meter's step times the slope), for the grouped goodness-of-fit test;
	 * absent, the step is detected. Not carried into the resolved options.
	 */
	gridStepMm?: number | null;
}

export type ResolvedOptions = Required<Omit<AssessOptions, 'binWidthMm' | 'gridStepMm'>> & {
	binWidthMm: number | null;
	percentiles: number[];
};

/** Fill in defaults and check ranges. Throws a plain message on a bad option. */
export function resolveOptions(
	requirement: CoverRequirement,
	options: AssessOptions = {}
): ResolvedOptions {
	const resolved: ResolvedOptions = {
		fractileP: options.fractileP ?? 0.05,
		confidence: options.confidence ?? 0.95,
		percentileType: options.percentileType ?? 7,
		model: options.model ?? 'best-fit',
		characteristicMethod: options.characteristicMethod ?? 'prediction',
		ruleSet: options.ruleSet ?? defaultRuleSet(requirement.codeSystem),
		minSampleSize: options.minSampleSize ?? 20,
		percentiles: [...(options.percentiles ?? [0.05, 0.1, 0.25, 0.5, 0.75, 0.9, 0.95])],
		displayUnit: options.displayUnit ?? 'mm',
		charts: options.charts ?? false,
		binWidthMm: options.binWidthMm ?? null
	};
	if (!(resolved.fractileP > 0 && resolved.fractileP < 0.5))
		throw new Error('fractile p must be in (0, 0.5)');
	if (!(resolved.confidence > 0.5 && resolved.confidence < 1))
		throw new Error('confidence must be in (0.5, 1)');
	if (!(Number.isInteger(resolved.minSampleSize) && resolved.minSampleSize >= 2))
		throw new Error('minimum sample size must be a whole number, at least 2');
	if (resolved.percentileType !== 6 && resolved.percentileType !== 7)
		throw new Error(`percentile type must be 6 or 7, not ${resolved.percentileType}`);
	if (!MODEL_CHOICES.includes(resolved.model))
		throw new Error(`model must be one of ${MODEL_CHOICES.join(', ')}`);
	if (!METHODS.includes(resolved.characteristicMethod))
		throw new Error(`characteristic method must be one of ${METHODS.join(', ')}`);
	if (!(resolved.ruleSet in RULE_SETS)) throw new Error(`unknown rule set ${resolved.ruleSet}`);
	return resolved;
}
