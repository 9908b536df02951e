/**
 * Exact operating characteristics of single rules: the probability that a rule passes a
 * population of which a true fraction p lies below c_min, at n readings.
 */
import { clopperPearsonUpper } from '../clopperPearson';
import type { CharacteristicMethod } from '../characteristicCover';
import { noncentralTCdf } from '../noncentralT';
import { normalCdf, normalQuantile } from '../normalDistribution';
import type { RuleId } from '../rules/ruleTypes';
import { binomialCdf } from './binomial';
import { characteristicFactor } from './penalty';

/** How a curve was obtained, named on the page and in the API. */
export type OcMethod = 'exact-binomial' | 'noncentral-t' | 'simulation';

export interface RuleOcSettings {
	method: CharacteristicMethod;
	fractileP: number;
	confidence: number;
	minSampleSize: number;
	allowedFractionBelow: number;
	/** (c_nom − ACI 117 tolerance) − c_min, mm: 0 when the ACI limit is c_min itself. */
	aciLimitAboveCMinMm: number;
	sdMm: number;
}

/**
 * The largest count of readings below c_min that the fraction-below rule still passes at n:
 * the largest c with the Clopper–Pearson upper bound (γ) ≤ the allowed share; −1 when even
 * none below fails. Cost: c + 2 beta quantiles.
 * @example acceptanceNumber(59, 0.05, 0.95) // 0 (0.95^59 < 0.05)
 */
export function acceptanceNumber(n: number, allowed: number, confidence: number): number {
	let c = -1;
	while (c + 1 <= n && clopperPearsonUpper(c + 1, n, confidence) <= allowed) c++;
	return c;
}

/** Zero readings below a limit that a share q of the population lies below: (1 − q)^n. */
function noneBelow(n: number, q: number): number {
	return binomialCdf(0, n, q);
}

/**
 * The characteristic rule x̄ − k·s ≥ c_min for a normal population with a share p below c_min:
 * √n(x̄ − c_min)/s is noncentral t with ν = n − 1 and δ = √n·z(1 − p), so
 * P(pass) = 1 − F_t'(k√n; n − 1, δ) (the variables acceptance sampling argument, ISO 3951-1).
 */
export function characteristicRuleOc(n: number, p: number, s: RuleOcSettings): number {
	if (n < s.minSampleSize) return 0;
	if (p <= 0) return 1;
	if (p >= 1) return 0;
	const k = characteristicFactor(n, s.method, s.fractileP, s.confidence);
	const root = Math.sqrt(n);
	return 1 - noncentralTCdf(k * root, n - 1, root * normalQuantile(1 - p));
}

/** Clopper–Pearson rule: pass with at most acceptanceNumber readings below c_min. */
export function fractionRuleOc(n: number, p: number, s: RuleOcSettings, c?: number): number {
	if (n < s.minSampleSize) return 0;
	const accept = c ?? acceptanceNumber(n, s.allowedFractionBelow, s.confidence);
	return binomialCdf(accept, n, p);
}

/** Share of a normal population below c_min + offset when a share p lies below c_min. */
export function shareBelowOffset(p: number, offsetMm: number, sdMm: number): number {
	if (offsetMm === 0 || p <= 0 || p >= 1) return p;
	if (!(sdMm > 0)) return offsetMm > 0 ? 1 : 0;
	return normalCdf(offsetMm / sdMm - normalQuantile(1 - p));
}

/** Which rules have an exact curve here, and by which method. excess-cover has none. */
export const EXACT_OC: Partial<Record<RuleId, OcMethod>> = {
	'every-reading-min': 'exact-binomial',
	'aci-tolerance': 'exact-binomial',
	'fraction-below-min': 'exact-binomial',
	'characteristic-min': 'noncentral-t'
};

/**
 * P(rule passes | n, p) by its exact method, or null for a rule without one (excess cover
 * depends on the upper tail, not on p; the empirical characteristic has no closed form).
 */
export function ruleOc(id: RuleId, n: number, p: number, s: RuleOcSettings): number | null {
	switch (id) {
		case 'every-reading-min':
			return noneBelow(n, p);
		case 'aci-tolerance':
			// The normal model carries p to the ACI limit when it is not c_min itself.
			return noneBelow(n, shareBelowOffset(p, s.aciLimitAboveCMinMm, s.sdMm));
		case 'fraction-below-min':
			return fractionRuleOc(n, p, s);
		case 'characteristic-min':
			return s.method === 'empirical' ? null : characteristicRuleOc(n, p, s);
		default:
			return null;
	}
}
