/**
 * Members that stand apart: do a population's members share one distribution, and which
 * members differ from the rest? Kruskal–Wallis and one-way ANOVA across the members, then
 * each member against the others by Mann–Whitney with Holm's correction.
 */
import { holmAdjust } from './holm';
import { kruskalWallisFromRanks, type KruskalWallisResult } from './kruskalWallis';
import { mannWhitneyFromRanks } from './mannWhitney';
import { pooledRanks } from './midRanks';
import { oneWayAnova, type OneWayAnovaResult } from './oneWayAnova';
import { percentileSorted } from './percentile';
import { countAtOrBelowSorted } from './readings';

/** Family-wise significance of "stands apart" (common practice: 5 %). */
export const MEMBER_SIGNIFICANCE = 0.05;
/** Members named one by one in the sentences; the rest are counted. */
const NAMED_AT_MOST = 5;

export interface MemberCovers {
	label: string;
	/** The member's own covers, ascending (mm). */
	coversMm: Float64Array;
}

export interface MemberDifference {
	label: string;
	n: number;
	medianMm: number;
	/** Median of every other member's readings together (mm). */
	restMedianMm: number;
	/** Mann–Whitney U of this member against the rest, and U/(n·n_rest). */
	u: number;
	commonLanguage: number;
	pValue: number;
	/** Holm-adjusted over all members. */
	holmPValue: number;
	direction: 'lower' | 'higher';
	standsApart: boolean;
}

export interface MemberComparison {
	members: number;
	n: number;
	significance: number;
	kruskalWallis: KruskalWallisResult;
	anova: OneWayAnovaResult;
	/** One entry a member, in the order given. */
	differences: MemberDifference[];
	/** Plain-language findings, for the verdict's reasons. */
	sentences: string[];
}

/** The j-th (1-based) smallest of the pooled readings without the member's own (O(log² N)). */
function restOrderStatistic(pooled: Float64Array, own: Float64Array, j: number): number {
	let lo = 0;
	let hi = pooled.length - 1;
	while (lo < hi) {
		const mid = (lo + hi) >>> 1;
		const v = pooled[mid];
		if (countAtOrBelowSorted(pooled, v) - countAtOrBelowSorted(own, v) >= j) hi = mid;
		else lo = mid + 1;
	}
	return pooled[lo];
}

/** Median of the rest (type 7 at 0.5: the middle value, or the mean of the two middle ones). */
function restMedian(pooled: Float64Array, own: Float64Array): number {
	const m = pooled.length - own.length;
	const a = restOrderStatistic(pooled, own, Math.floor((m + 1) / 2));
	return m % 2 === 1 ? a : (a + restOrderStatistic(pooled, own, m / 2 + 1)) / 2;
}

const pText = (p: number) => (p < 0.001 ? 'p < 0.001' : `p = ${p.toFixed(3)}`);
const mmText = (v: number) => `${v.toFixed(1)} mm`;

function sentences(c: Omit<MemberComparison, 'sentences'>): string[] {
	const kw = c.kruskalWallis;
	if (kw.pValue >= c.significance) {
		return [
			`The ${c.members} members share one distribution as far as the readings show ` +
				`(Kruskal–Wallis ${pText(kw.pValue)}).`
		];
	}
	const apart = c.differences
		.filter((d) => d.standsApart)
		.sort((a, b) => Math.abs(b.medianMm - b.restMedianMm) - Math.abs(a.medianMm - a.restMedianMm));
	const out = [
		`The ${c.members} members do not share one distribution (Kruskal–Wallis ${pText(kw.pValue)}; ` +
			`between-member SD ${mmText(c.anova.betweenSdMm)} against ${mmText(c.anova.withinSdMm)} within a member).`
	];
	for (const d of apart.slice(0, NAMED_AT_MOST)) {
		out.push(
			`Member ${d.label} is ${d.direction} than the other ${c.members - 1}: median ` +
				`${mmText(d.medianMm)} against ${mmText(d.restMedianMm)} (Mann–Whitney, Holm-adjusted ` +
				`${pText(d.holmPValue)}).`
		);
	}
	if (apart.length > NAMED_AT_MOST) {
		out.push(`${apart.length - NAMED_AT_MOST} more members stand apart (see the table).`);
	}
	if (apart.length === 0) {
		out.push('No single member stands apart from the rest after Holm’s correction.');
	}
	return out;
}

/**
 * Compare the members of a population. Kruskal–Wallis (tie-corrected) and one-way ANOVA
 * (between- and within-member SD) across members; each member against all the others by a
 * two-sided Mann–Whitney test from the same pooled ranks, Holm-adjusted over the members; a
 * member "stands apart" at Holm p < significance. `pooled` is every member's covers, sorted.
 * Cost O(N log N) for N readings (one binary search a distinct value a member), plus
 * O(k log² N) for the medians of the rest. Needs 2 members with readings; null otherwise.
 * @example compareMembers(members, pooled)?.sentences[1] // "Member B-03 is lower than …"
 */
export function compareMembers(
	members: readonly MemberCovers[],
	pooled: Float64Array,
	significance = MEMBER_SIGNIFICANCE
): MemberComparison | null {
	const withReadings = members.filter((m) => m.coversMm.length > 0);
	const k = withReadings.length;
	if (k < 2 || pooled.length <= k) return null;
	const groups = withReadings.map((m) => m.coversMm);
	const sizes = groups.map((g) => g.length);
	const ranks = pooledRanks(groups, pooled);
	const n = pooled.length;
	const tests = withReadings.map((m, i) =>
		mannWhitneyFromRanks(ranks.rankSums[i], sizes[i], n - sizes[i], ranks.tieTerm)
	);
	const holm = holmAdjust(tests.map((t) => t.pValue));
	const differences = withReadings.map((m, i): MemberDifference => {
		const medianMm = percentileSorted(m.coversMm, 0.5, 7);
		const rest = restMedian(pooled, m.coversMm);
		return {
			label: m.label,
			n: sizes[i],
			medianMm,
			restMedianMm: rest,
			u: tests[i].u,
			commonLanguage: tests[i].commonLanguage,
			pValue: tests[i].pValue,
			holmPValue: holm[i],
			direction: tests[i].commonLanguage < 0.5 ? 'lower' : 'higher',
			standsApart: holm[i] < significance
		};
	});
	const result = {
		members: k,
		n,
		significance,
		kruskalWallis: kruskalWallisFromRanks(ranks, sizes),
		anova: oneWayAnova(groups),
		differences
	};
	return { ...result, sentences: sentences(result) };
}
