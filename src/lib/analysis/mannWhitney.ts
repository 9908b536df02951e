/**
 * Mann–Whitney U test, two-sided, by the normal approximation with tie and continuity
 * corrections (H. B. Mann & D. R. Whitney, Ann. Math. Statist. 18 (1947) 50–60; the tie
 * correction of the variance as in scipy.stats.mannwhitneyu(method='asymptotic')).
 */
import { normalCdf } from './normalDistribution';
import { poolSorted, pooledRanks } from './midRanks';

export interface MannWhitneyResult {
	/** U of the first sample: R₁ − n₁(n₁ + 1)/2. */
	u: number;
	/** U/(n₁n₂): the chance that a reading of the first sample exceeds one of the second (ties ½). */
	commonLanguage: number;
	z: number;
	pValue: number;
}

/**
 * Two-sided Mann–Whitney test of a first sample (rank sum `rankSum`, size n1) against a second
 * (size n2), ranked together with tie term Σ(t³ − t). Cost O(1).
 */
export function mannWhitneyFromRanks(
	rankSum: number,
	n1: number,
	n2: number,
	tieTerm: number
): MannWhitneyResult {
	const n = n1 + n2;
	const u = rankSum - (n1 * (n1 + 1)) / 2;
	const mu = (n1 * n2) / 2;
	const variance = ((n1 * n2) / 12) * (n + 1 - tieTerm / (n * (n - 1)));
	if (!(variance > 0)) return { u, commonLanguage: u / (n1 * n2), z: 0, pValue: 1 };
	const z = Math.max(0, Math.abs(u - mu) - 0.5) / Math.sqrt(variance);
	return {
		u,
		commonLanguage: u / (n1 * n2),
		z: u >= mu ? z : -z,
		pValue: Math.min(1, 2 * normalCdf(-z))
	};
}

/**
 * Two-sided Mann–Whitney U test of sorted samples x and y. Cost O((n₁ + n₂) log(n₁ + n₂)).
 * Needs a reading in each.
 * @example mannWhitney(Float64Array.of(1, 2, 3), Float64Array.of(4, 5, 6)).u // 0
 */
export function mannWhitney(x: Float64Array, y: Float64Array): MannWhitneyResult {
	if (x.length === 0 || y.length === 0)
		throw new Error('mannWhitney needs at least 1 readings in each sample');
	const pooled = poolSorted([x, y]);
	const ranks = pooledRanks([x, y], pooled);
	return mannWhitneyFromRanks(ranks.rankSums[0], x.length, y.length, ranks.tieTerm);
}
