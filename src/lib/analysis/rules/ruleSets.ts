/**
 * Named rule sets. A rule set is chosen per group of members.
 */
import type { CodeSystem } from '../requirements/requirement';
import {
	aciTolerance,
	characteristicMin,
	everyReadingMin,
	excessCover,
	fractionBelowMin
} from './coverRules';
import type { RuleContext, RuleId, RuleOutcome, RuleResult } from './ruleTypes';

export const RULE_SETS = {
	/** Statistical acceptance in the EN 1992/EN 1990 spirit. */
	'en-statistical': ['characteristic-min', 'fraction-below-min', 'excess-cover'],
	/** ACI 318/ACI 117: each reading within tolerance of the specified cover. */
	'aci-tolerance': ['aci-tolerance', 'excess-cover'],
	/** No reading below c_min at all. */
	'strict-minimum': ['every-reading-min', 'excess-cover'],
	/** Every rule, for a review. */
	'full-review': [
		'every-reading-min',
		'characteristic-min',
		'fraction-below-min',
		'aci-tolerance',
		'excess-cover'
	]
} as const satisfies Record<string, readonly RuleId[]>;

export type RuleSetName = keyof typeof RULE_SETS;

const RULES: Record<RuleId, (ctx: RuleContext) => RuleResult> = {
	'every-reading-min': everyReadingMin,
	'characteristic-min': characteristicMin,
	'fraction-below-min': fractionBelowMin,
	'aci-tolerance': aciTolerance,
	'excess-cover': excessCover
};

/** The rule set used when none is chosen. */
export function defaultRuleSet(codeSystem: CodeSystem): RuleSetName {
	return codeSystem === 'ACI' ? 'aci-tolerance' : 'en-statistical';
}

export interface RuleSetResult {
	rules: RuleResult[];
	skippedRules: { id: RuleId; reason: string }[];
	/** fail if any rule fails; else not-enough-data if any lacks data; else pass. */
	verdict: RuleOutcome;
}

/**
 * Run a named rule set. The excess-cover rule is skipped (and listed) when no Δplus is given.
 * Cost: O(log n) a rule on the precomputed context.
 * @example runRuleSet('en-statistical', ctx).verdict // 'pass'
 */
export function runRuleSet(name: RuleSetName, ctx: RuleContext): RuleSetResult {
	const rules: RuleResult[] = [];
	const skippedRules: { id: RuleId; reason: string }[] = [];
	for (const id of RULE_SETS[name] as readonly RuleId[]) {
		if (id === 'excess-cover' && (ctx.requirement.deltaPlusMm ?? null) === null) {
			skippedRules.push({ id, reason: 'No upper tolerance on cover was given.' });
			continue;
		}
		rules.push(RULES[id](ctx));
	}
	const outcomes = rules.map((r) => r.outcome);
	const verdict: RuleOutcome = outcomes.includes('fail')
		? 'fail'
		: outcomes.includes('not-enough-data')
			? 'not-enough-data'
			: 'pass';
	return { rules, skippedRules, verdict };
}
