/**
 * Members that stand apart: do a population's members share one distribution, and which
 * members differ from the rest? Kruskal–Wallis and one-way ANOVA across the members, then
 * each member against the others by Mann–Whitney with Holm's correction.
 */
import { type CountedSample, countedFromSorted, percentileCounted } from './countedSample';
import { holmAdjust } from './holm';
import { kruskalWallisFromRanks, type KruskalWallisResult } from './kruskalWallis';
import { mannWhitneyFromRanks } from './mannWhitney';
import { pooledRanksCounted } from './midRanks';
import { oneWayAnovaCounted, type OneWayAnovaResult } from './oneWayAnova';

/** Family-wise significance of "stands apart" (common practice: 5 %). */
export const MEMBER_SIGNIFICANCE = 0.05;
/** Members named one by one in the sentences; the rest are counted. */
const NAMED_AT_MOST = 5;

export interface MemberCovers {
	label: string;
	/** The member's own covers, ascending (mm). */
	coversMm: Float64Array;
}

/** A member's readings held as counts (analysis/countedSample.ts). */
export interface MemberCounts {
	label: string;
	sample: CountedSample;
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

/**
 * The rest's order statistics x(j) (1-based, ascending j) when a member's readings are taken
 * out of the pool: a walk of the pooled counts less the member's own. Cost O(D_pooled).
 */
function restOrderStatistics(pooled: CountedSample, own: CountedSample, js: number[]): number[] {
	const out: number[] = [];
	let p = 0;
	let through = 0;
	let next = 0;
	for (let i = 0; i < pooled.values.length && next < js.length; i++) {
		const v = pooled.values[i];
		let count = pooled.counts[i];
		if (p < own.values.length && own.values[p] === v) count -= own.counts[p++];
		through += count;
		while (next < js.length && through >= js[next]) {
			out.push(v);
			next++;
		}
	}
	return out;
}

/** Median of the rest (type 7 at 0.5: the middle value, or the mean of the two middle ones). */
function restMedian(pooled: CountedSample, own: CountedSample): number {
	const m = pooled.n - own.n;
	if (m % 2 === 1) return restOrderStatistics(pooled, own, [(m + 1) / 2])[0];
	const [a, b] = restOrderStatistics(pooled, own, [m / 2, m / 2 + 1]);
	return (a + b) / 2;
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
 * The members are counted and compared by compareMembersCounted (one code path). Cost O(N) to
 * count, then that of the counted form. Needs 2 members with readings; null otherwise.
 * @example compareMembers(members, pooled)?.sentences[1] // "Member B-03 is lower than …"
 */
export function compareMembers(
	members: readonly MemberCovers[],
	pooled: Float64Array,
	significance = MEMBER_SIGNIFICANCE
): MemberComparison | null {
	return compareMembersCounted(
		members.map((m) => ({ label: m.label, sample: countedFromSorted(m.coversMm) })),
		countedFromSorted(pooled),
		significance
	);
}

/**
 * compareMembers of members held as counts, `pooled` their counts merged (mergeCounted). The
 * ranks, Mann–Whitney and Kruskal–Wallis statistics, medians and Holm's adjustment are those of
 * the readings expanded to the bit (whole-number counts, the same operations in the same order);
 * the ANOVA comes from whole-number sums on the grid (oneWayAnovaCounted). Cost
 * O(k·D) for k members over D pooled distinct values, whatever the number of readings.
 */
export function compareMembersCounted(
	members: readonly MemberCounts[],
	pooled: CountedSample,
	significance = MEMBER_SIGNIFICANCE
): MemberComparison | null {
	const withReadings = members.filter((m) => m.sample.n > 0);
	const k = withReadings.length;
	if (k < 2 || pooled.n <= k) return null;
	const groups = withReadings.map((m) => m.sample);
	const sizes = groups.map((g) => g.n);
	const ranks = pooledRanksCounted(groups, pooled);
	const n = pooled.n;
	const tests = withReadings.map((m, i) =>
		mannWhitneyFromRanks(ranks.rankSums[i], sizes[i], n - sizes[i], ranks.tieTerm)
	);
	const holm = holmAdjust(tests.map((t) => t.pValue));
	const differences = withReadings.map((m, i): MemberDifference => {
		const medianMm = percentileCounted(m.sample, 0.5, 7);
		const rest = restMedian(pooled, m.sample);
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
		anova: oneWayAnovaCounted(groups),
		differences
	};
	return { ...result, sentences: sentences(result) };
}
