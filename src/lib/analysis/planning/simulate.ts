/**
 * The whole rule set's operating characteristic by seeded simulation: normal populations with a
 * share p below c_min and the planned SD, n readings drawn, the population assessment run as
 * the population page runs it, the share of passes counted.
 */

/**
 * The rule set's verdict on sorted covers, from the same context assessPopulation builds but
 * without the variables-method bounds on the share below c_min: no rule reads them, and their
 * noncentral t solves (≈ 3 ms a population) would make a simulation of thousands of draws
 * take seconds. Every figure a rule does read comes from the same engine functions.
 */
export function ruleSetVerdict(
	sorted: Float64Array,
	requirement: CoverRequirement,
	options: ResolvedOptions
) {
	const type = options.percentileType;
	const models = compareModels(sorted);
	const model =
		options.model === 'best-fit'
			? models.better
			: options.model === 'lognormal' && models.lognormal
				? 'lognormal'
				: 'normal';
	const n = sorted.length;
	const count = countBelowSorted(sorted, requirement.cMinMm);
	const fraction = {
		limitMm: requirement.cMinMm,
		confidence: options.confidence,
		n,
		count,
		empirical: count / n,
		upperBound: clopperPearsonUpper(count, n, options.confidence)
	} as FractionBelow;
	return runRuleSet(options.ruleSet, {
		sample: countedFromSorted(sorted),
		description: describeSorted(sorted, type),
		models,
		characteristic: characteristicCovers(
			sorted,
			models.normal,
			models.lognormal,
			options.fractileP,
			options.confidence,
			type
		),
		fractionBelowCMin: fraction,
		requirement: { ...requirement, allowedFractionBelow: allowedFractionOf(requirement) },
		method: options.characteristicMethod,
		model,
		minSampleSize: options.minSampleSize,
		percentileType: type,
		unit: 'mm'
	}).verdict;
}
import { resolveOptions, type AssessOptions, type ResolvedOptions } from '../assessOptions';
import { characteristicCovers } from '../characteristicCover';
import { clopperPearsonUpper } from '../clopperPearson';
import { countedFromSorted } from '../countedSample';
import { describeSorted } from '../describe';
import type { FractionBelow } from '../fractionBelow';
import { compareModels } from '../goodnessOfFit';
import { countBelowSorted } from '../readings';
import { allowedFractionOf } from '../requirements/requirement';
import { runRuleSet } from '../rules/ruleSets';
import { mulberry32, normalSampler } from '../durability/prng';
import { normalQuantile } from '../normalDistribution';
import type { CoverRequirement } from '../requirements/requirement';

export interface SimulatedPoint {
	p: number;
	/** Share of the replicates the rule set passed. */
	accept: number;
	/** Binomial standard error of that share. */
	standardError: number;
}

/**
 * P(rule set passes) at each p by `replicates` seeded draws of n normal readings with mean
 * c_min + z(1 − p)·σ. Cost: replicates × |ps| assessments of n readings (≈ 0.1 ms each at
 * n = 50). Same seed, same answer.
 * @example simulateRuleSetOc(60, [0.01, 0.1], 8, requirement, { ruleSet: 'en-statistical' }, 200, 1)
 */
export function simulateRuleSetOc(
	n: number,
	ps: readonly number[],
	sdMm: number,
	requirement: CoverRequirement,
	options: AssessOptions,
	replicates: number,
	seed: number
): SimulatedPoint[] {
	if (!(Number.isInteger(n) && n >= 2)) throw new Error('simulateRuleSetOc needs 2 readings');
	if (!(sdMm > 0)) throw new Error('simulateRuleSetOc needs an SD above 0 mm');
	const resolved = resolveOptions(requirement, options);
	const draw = normalSampler(mulberry32(seed));
	const covers = new Float64Array(n);
	return ps.map((p) => {
		const meanMm = requirement.cMinMm + normalQuantile(1 - p) * sdMm;
		let passes = 0;
		for (let r = 0; r < replicates; r++) {
			// A cover meter reads no cover below 0 mm.
			for (let i = 0; i < n; i++) covers[i] = Math.max(0, meanMm + sdMm * draw());
			if (ruleSetVerdict(covers.slice().sort(), requirement, resolved) === 'pass') passes++;
		}
		const accept = passes / replicates;
		return { p, accept, standardError: Math.sqrt((accept * (1 - accept)) / replicates) };
	});
}
