/**
 * Shapes shared by the compliance rules.
 */
import type { CharacteristicCovers, CharacteristicMethod } from '../characteristicCover';
import type { CountedSample } from '../countedSample';
import type { CoverDescription } from '../describe';
import type { ModelName } from '../fitModels';
import type { FractionBelow } from '../fractionBelow';
import type { ModelComparison } from '../goodnessOfFit';
import type { PercentileType } from '../percentile';
import type { CoverRequirement } from '../requirements/requirement';
import type { LengthUnit } from '../units';

export type RuleId =
	| 'every-reading-min'
	| 'characteristic-min'
	| 'fraction-below-min'
	| 'aci-tolerance'
	| 'excess-cover';

export type RuleOutcome = 'pass' | 'fail' | 'not-enough-data';

export interface RuleResult {
	id: RuleId;
	title: string;
	outcome: RuleOutcome;
	/** One sentence a client understands. */
	reason: string;
	/** The figures the rule used (mm, fractions, counts). */
	figures: Record<string, number | string | null>;
}

/** Everything a rule may read; computed once per population. */
export interface RuleContext {
	/** The readings as counts of distinct values (countedFromSorted for a raw array). */
	sample: CountedSample;
	description: CoverDescription;
	models: ModelComparison;
	characteristic: CharacteristicCovers;
	fractionBelowCMin: FractionBelow;
	requirement: CoverRequirement;
	method: CharacteristicMethod;
	model: ModelName;
	minSampleSize: number;
	/** Hyndman–Fan type of every empirical percentile a rule takes. */
	percentileType: PercentileType;
	unit: LengthUnit;
}
