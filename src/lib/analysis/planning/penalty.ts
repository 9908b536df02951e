/**
 * The finite-sample penalty on the characteristic cover: how far below the asymptotic fractile
 * μ − z(1 − p)·σ a characteristic value from n readings is placed because σ is estimated.
 */
import type { CharacteristicMethod } from '../characteristicCover';
import { predictionFactor, toleranceFactor } from '../characteristicFactors';
import { normalQuantile } from '../normalDistribution';

/** The factor the characteristic rule multiplies s by at n readings (z for the model quantile). */
export function characteristicFactor(
	n: number,
	method: CharacteristicMethod,
	p: number,
	confidence: number
): number {
	if (method === 'prediction') return predictionFactor(n, p);
	if (method === 'tolerance') return toleranceFactor(n, p, confidence);
	return normalQuantile(1 - p);
}

/**
 * Penalty (k(n) − z(1 − p))·s in mm: EN 1990 D7.2's k_n for the prediction method, the ISO
 * 16269-6 tolerance factor for the tolerance method, 0 for the model quantile and the empirical
 * percentile (neither takes a factor; the empirical percentile's scatter is judged by the
 * operating characteristic instead). Needs n ≥ 2 and s ≥ 0.
 * @example characteristicPenaltyMm(10, 8, 'prediction', 0.05, 0.95) // (1.9230 − 1.6449)·8 ≈ 2.22
 */
export function characteristicPenaltyMm(
	n: number,
	sdMm: number,
	method: CharacteristicMethod,
	p = 0.05,
	confidence = 0.95
): number {
	if (!(sdMm >= 0)) throw new Error('characteristicPenaltyMm needs an SD ≥ 0 mm');
	if (method === 'model' || method === 'empirical') return 0;
	return (characteristicFactor(n, method, p, confidence) - normalQuantile(1 - p)) * sdMm;
}

/** Most readings any search here considers: beyond it the answer is "more than this". */
export const MAX_PLANNED_READINGS = 5000;

/**
 * Smallest n ≥ 2 whose penalty is at most `marginMm` (the penalty falls as n grows, so a
 * doubling then a bisection: ≈ 25 factor evaluations). null when even MAX_PLANNED_READINGS
 * readings leave a larger penalty.
 * @example readingsForPenalty(2, 8, 'prediction', 0.05, 0.95) // 13
 */
export function readingsForPenalty(
	marginMm: number,
	sdMm: number,
	method: CharacteristicMethod,
	p = 0.05,
	confidence = 0.95
): number | null {
	if (!(marginMm > 0)) throw new Error('readingsForPenalty needs a margin above 0 mm');
	const ok = (n: number) => characteristicPenaltyMm(n, sdMm, method, p, confidence) <= marginMm;
	return smallestMonotone(ok, 2, MAX_PLANNED_READINGS);
}

/** Smallest whole n in [lo, hi] with ok(n), for ok false then true as n grows; null if none. */
export function smallestMonotone(
	ok: (n: number) => boolean,
	lo: number,
	hi: number
): number | null {
	if (ok(lo)) return lo;
	let below = lo;
	let above = lo;
	while (!ok(above)) {
		below = above;
		if (above >= hi) return null;
		above = Math.min(hi, above * 2);
	}
	while (above - below > 1) {
		const mid = Math.floor((below + above) / 2);
		if (ok(mid)) above = mid;
		else below = mid;
	}
	return above;
}
