/**
 * Pooled mid-ranks of several groups, the common ground of Kruskal–Wallis and Mann–Whitney.
 * Our own: simple-statistics and jstat rank no groups.
 */
import { countAtOrBelowSorted, countBelowSorted } from './readings';

export interface PooledRanks {
	/** Readings in all groups together. */
	n: number;
	/** Sum of the pooled mid-ranks (1-based) of each group's readings. */
	rankSums: number[];
	/** Σ(t³ − t) over the runs of tied values in the pooled sample (the tie correction's term). */
	tieTerm: number;
}

/**
 * Mid-ranks of each group in the pooled sample: a value v takes the rank
 * (#below v + #at-or-below v + 1)/2, ties sharing the mean of their ranks (Kruskal & Wallis
 * 1952, §1.3). Groups must each be sorted ascending; `pooled` is all their values, sorted.
 * Cost O(N log N) binary searches (a run of equal values in a group costs one), N readings.
 * @example pooledRanks([Float64Array.of(1, 2), Float64Array.of(2, 3)], Float64Array.of(1, 2, 2, 3)).rankSums // [3.5, 6.5]
 */
export function pooledRanks(groups: readonly Float64Array[], pooled: Float64Array): PooledRanks {
	const rankSums = groups.map((group) => {
		let sum = 0;
		for (let i = 0; i < group.length;) {
			const v = group[i];
			let j = i;
			while (j < group.length && group[j] === v) j++;
			const below = countBelowSorted(pooled, v);
			const atOrBelow = countAtOrBelowSorted(pooled, v);
			sum += (j - i) * ((below + atOrBelow + 1) / 2);
			i = j;
		}
		return sum;
	});
	let tieTerm = 0;
	for (let i = 0; i < pooled.length;) {
		let j = i;
		while (j < pooled.length && pooled[j] === pooled[i]) j++;
		const t = j - i;
		tieTerm += t * t * t - t;
		i = j;
	}
	return { n: pooled.length, rankSums, tieTerm };
}

/** All groups' values in one ascending array (a copy). Cost O(N log N). */
export function poolSorted(groups: readonly Float64Array[]): Float64Array {
	const total = groups.reduce((s, g) => s + g.length, 0);
	const out = new Float64Array(total);
	let at = 0;
	for (const g of groups) {
		out.set(g, at);
		at += g.length;
	}
	return out.sort();
}
