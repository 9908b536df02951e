/**
 * Reliability index against a target.
 */
import { normalQuantile } from '../normalDistribution';

/**
 * Target reliability index for depassivation (serviceability limit state), β = 1.3, i.e. a
 * probability of about 10 %: fib Bulletin 34, Model Code for Service Life Design (2006) —
 * from memory, not checked against the bulletin's text here. ISO 16204:2012 repeats it (also
 * from memory).
 */
export const FIB_TARGET_BETA_DEPASSIVATION = 1.3;

/**
 * β = −Φ⁻¹(P) for a probability of failure P; null when P is 0 or 1 (β = ±∞).
 * @example reliabilityIndex(0.0968) // ≈ 1.30
 */
export function reliabilityIndex(probability: number): number | null {
	if (!(probability > 0 && probability < 1)) return null;
	return -normalQuantile(probability);
}

/** Whether β meets the target; P = 0 always does, P = 1 never. */
export function meetsTargetBeta(
	probability: number,
	targetBeta = FIB_TARGET_BETA_DEPASSIVATION
): boolean {
	const beta = reliabilityIndex(probability);
	if (beta === null) return probability <= 0;
	return beta >= targetBeta;
}
