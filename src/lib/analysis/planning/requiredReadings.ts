/**
 * The number of readings each rule needs to discriminate: accept a population with a share p0
 * below c_min with probability ≥ 1 − α, and reject one at p1 with probability ≥ 1 − β.
 */
import type { RuleId } from '../rules/ruleTypes';
import { binomialCdf } from './binomial';
import { clopperPearsonUpper } from '../clopperPearson';
import {
	characteristicRuleOc,
	shareBelowOffset,
	type RuleOcSettings
} from './operatingCharacteristic';
import { MAX_PLANNED_READINGS, smallestMonotone } from './penalty';

export interface Discrimination {
	p0: number;
	p1: number;
	alpha: number;
	beta: number;
}

export interface RuleReadings {
	/** Smallest n meeting both sides; null when no n up to the limit does. */
	n: number | null;
	/** Why there is no n, in words; null when there is one. */
	note: string | null;
}

const meets = (acc0: number, acc1: number, d: Discrimination) =>
	acc0 >= 1 - d.alpha && acc1 <= d.beta;

/** Zero-acceptance rules: rejection needs n large, acceptance n small; one interval of n. */
function zeroAcceptance(q0: number, q1: number, d: Discrimination): RuleReadings {
	const n = smallestMonotone((m) => binomialCdf(0, m, q1) <= d.beta, 1, MAX_PLANNED_READINGS);
	if (n === null) return { n: null, note: `More than ${MAX_PLANNED_READINGS} readings.` };
	const acc0 = binomialCdf(0, n, q0);
	if (acc0 >= 1 - d.alpha) return { n, note: null };
	return {
		n: null,
		note:
			`With no reading allowed below the limit, the ${n} readings that reject p1 would pass ` +
			`a population at p0 only ${(100 * acc0).toFixed(1)} % of the time.`
	};
}

/** Clopper–Pearson rule: the OC saw-tooths with n, so every n is tried, c(n) carried along. */
function fractionRule(d: Discrimination, s: RuleOcSettings): RuleReadings {
	let c = -1;
	for (let n = Math.max(2, s.minSampleSize); n <= MAX_PLANNED_READINGS; n++) {
		// c(n) never falls as n grows: only step it up.
		while (c + 1 <= n && clopperPearsonUpper(c + 1, n, s.confidence) <= s.allowedFractionBelow) c++;
		if (c < 0) continue;
		if (meets(binomialCdf(c, n, d.p0), binomialCdf(c, n, d.p1), d)) return { n, note: null };
	}
	return { n: null, note: `More than ${MAX_PLANNED_READINGS} readings.` };
}

/**
 * n for one rule, or null with the reason; rules without an exact OC answer null with a note
 * (excess cover does not depend on p; the empirical characteristic is simulated).
 * Cost: a bisection for the monotone rules; up to n_max steps for the saw-tooth one.
 * @example readingsForRule('every-reading-min', { p0: 0.0001, p1: 0.05, alpha: 0.05, beta: 0.05 }, s).n // 59
 */
export function readingsForRule(id: RuleId, d: Discrimination, s: RuleOcSettings): RuleReadings {
	if (!(d.p0 < d.p1)) return { n: null, note: 'p0 must be below p1.' };
	switch (id) {
		case 'every-reading-min':
			return zeroAcceptance(d.p0, d.p1, d);
		case 'aci-tolerance':
			return zeroAcceptance(
				shareBelowOffset(d.p0, s.aciLimitAboveCMinMm, s.sdMm),
				shareBelowOffset(d.p1, s.aciLimitAboveCMinMm, s.sdMm),
				d
			);
		case 'fraction-below-min':
			return fractionRule(d, s);
		case 'characteristic-min': {
			if (s.method === 'empirical')
				return {
					n: null,
					note: 'The empirical percentile has no exact curve; see the simulation.'
				};
			const ok = (n: number) =>
				meets(characteristicRuleOc(n, d.p0, s), characteristicRuleOc(n, d.p1, s), d);
			const n = smallestMonotone(ok, Math.max(2, s.minSampleSize), MAX_PLANNED_READINGS);
			return n === null
				? {
						n: null,
						note: `No n up to ${MAX_PLANNED_READINGS} meets both sides: p0 and p1 must lie either side of the fractile ${s.fractileP}.`
					}
				: { n, note: null };
		}
		default:
			return { n: null, note: 'This rule does not depend on the share below c_min.' };
	}
}
