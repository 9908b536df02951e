/**
 * Pooled mid-ranks of several groups, the common ground of Kruskal–Wallis and Mann–Whitney.
 * Our own: simple-statistics and jstat rank no groups.
 */
import type { CountedSample } from './countedSample';
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

/**
 * pooledRanks of groups held as counts: the same mid-ranks a distinct value at a time (a run of
 * equal readings in a group is one term, as in pooledRanks), from the pooled counts' running
 * total — whole numbers throughout, so the rank sums and tie term are those of pooledRanks to
 * the bit. Every group's values must be among the pooled values. Cost O(D_pooled + Σ D_group).
 */
export function pooledRanksCounted(
	groups: readonly CountedSample[],
	pooled: CountedSample
): PooledRanks {
	// Each pooled value's place, and the readings strictly below it.
	const place = new Map<number, number>();
	const before = new Float64Array(pooled.values.length);
	let running = 0;
	let tieTerm = 0;
	for (let i = 0; i < pooled.values.length; i++) {
		place.set(pooled.values[i], i);
		before[i] = running;
		const t = pooled.counts[i];
		running += t;
		tieTerm += t * t * t - t;
	}
	const rankSums = groups.map((group) => {
		let sum = 0;
		for (let i = 0; i < group.values.length; i++) {
			const at = place.get(group.values[i]);
			if (at === undefined) throw new Error(`pooled counts lack the value ${group.values[i]}`);
			const below = before[at];
			const atOrBelow = below + pooled.counts[at];
			sum += group.counts[i] * ((below + atOrBelow + 1) / 2);
		}
		return sum;
	});
	return { n: pooled.n, rankSums, tieTerm };
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
