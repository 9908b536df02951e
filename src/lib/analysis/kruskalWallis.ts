/**
 * Kruskal–Wallis test: do several groups come from one distribution?
 * Reference: W. H. Kruskal & W. A. Wallis, "Use of ranks in one-criterion variance analysis",
 * JASA 47 (1952) 583–621, Eq. 1.1 and the tie correction of §1.3; as scipy.stats.kruskal.
 */
import jStat from 'jstat';
import { pooledRanks, type PooledRanks } from './midRanks';

export interface KruskalWallisResult {
	/** H corrected for ties: H / (1 − Σ(t³ − t)/(N³ − N)). */
	statistic: number;
	degreesOfFreedom: number;
	/** Upper tail of χ² with k − 1 degrees of freedom (large-sample approximation). */
	pValue: number;
	groups: number;
	n: number;
}

/** H from pooled ranks (see kruskalWallis). */
export function kruskalWallisFromRanks(
	ranks: PooledRanks,
	sizes: readonly number[]
): KruskalWallisResult {
	const { n, rankSums, tieTerm } = ranks;
	let sum = 0;
	for (let i = 0; i < sizes.length; i++) sum += (rankSums[i] * rankSums[i]) / sizes[i];
	const h = (12 / (n * (n + 1))) * sum - 3 * (n + 1);
	const correction = 1 - tieTerm / (n * n * n - n);
	// Every reading equal: no ranks to compare, H is 0/0; the groups cannot be told apart.
	const statistic = correction > 0 ? Math.max(0, h / correction) : 0;
	const dof = sizes.length - 1;
	return {
		statistic,
		degreesOfFreedom: dof,
		pValue: 1 - jStat.chisquare.cdf(statistic, dof),
		groups: sizes.length,
		n
	};
}

/**
 * Kruskal–Wallis H test across groups of readings, each sorted ascending, with `pooled` all
 * their values sorted. Definition: H = 12/(N(N+1))·Σ R_i²/n_i − 3(N + 1), divided by the tie
 * correction; p from χ²(k − 1). Cost O(N log N). Needs 2 groups, each with a reading.
 * @example kruskalWallis([a, b, c], pooled).pValue // e.g. 0.013
 */
export function kruskalWallis(
	groups: readonly Float64Array[],
	pooled: Float64Array
): KruskalWallisResult {
	if (groups.length < 2 || groups.some((g) => g.length === 0))
		throw new Error('kruskalWallis needs at least 2 groups, each with a reading');
	return kruskalWallisFromRanks(
		pooledRanks(groups, pooled),
		groups.map((g) => g.length)
	);
}
