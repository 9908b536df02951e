/**
 * One-way analysis of variance across groups, with the between- and within-group SDs.
 * References: scipy.stats.f_oneway (the F test); the variance components by the method of
 * moments for unbalanced groups, S. R. Searle, G. Casella & C. E. McCulloch, Variance
 * Components (Wiley 1992) §3.6, Eq. 3.6.3 with n₀ = (N − Σn_i²/N)/(k − 1) (as ISO 5725-2
 * separates between- and within-laboratory variance). Our own: the packages have no ANOVA.
 */
import jStat from 'jstat';
import type { CountedSample } from './countedSample';

export interface OneWayAnovaResult {
	/** F = MS_between / MS_within. */
	statistic: number;
	degreesOfFreedomBetween: number;
	degreesOfFreedomWithin: number;
	pValue: number;
	/** √MS_within: the spread of readings within a member (mm). */
	withinSdMm: number;
	/** √max(0, (MS_between − MS_within)/n₀): the spread of the members' own means (mm). */
	betweenSdMm: number;
	/** Grand mean (mm). */
	meanMm: number;
}

/** The F test and variance components from the sums of squares (both forms end here). */
function anovaFrom(
	sizes: readonly number[],
	between: number,
	within: number,
	grand: number
): OneWayAnovaResult {
	const k = sizes.length;
	const n = sizes.reduce((s, x) => s + x, 0);
	const dfb = k - 1;
	const dfw = n - k;
	const msb = between / dfb;
	const msw = within / dfw;
	const n0 = (n - sizes.reduce((s, x) => s + x * x, 0) / n) / dfb;
	// Every group without spread of its own: F is infinite when the means differ, 0/0 when not.
	const statistic = msw > 0 ? msb / msw : msb > 0 ? Infinity : 0;
	return {
		statistic,
		degreesOfFreedomBetween: dfb,
		degreesOfFreedomWithin: dfw,
		pValue: Number.isFinite(statistic) ? 1 - jStat.centralF.cdf(statistic, dfb, dfw) : 0,
		withinSdMm: Math.sqrt(msw),
		betweenSdMm: Math.sqrt(Math.max(0, (msb - msw) / n0)),
		meanMm: grand
	};
}

function requireGroups(sizes: readonly number[]): void {
	const n = sizes.reduce((s, x) => s + x, 0);
	if (sizes.length < 2 || sizes.some((x) => x === 0) || n <= sizes.length)
		throw new Error(
			'oneWayAnova needs at least 2 groups, each with a reading, and more readings than groups'
		);
}

/**
 * One-way ANOVA of groups of readings (mm). Cost O(N), two passes. Needs 2 groups and more
 * readings than groups.
 * @example oneWayAnova([a, b, c]).pValue // as scipy.stats.f_oneway(a, b, c).pvalue
 */
export function oneWayAnova(
	groups: readonly (readonly number[] | Float64Array)[]
): OneWayAnovaResult {
	const sizes = groups.map((g) => g.length);
	requireGroups(sizes);
	const n = sizes.reduce((s, x) => s + x, 0);
	const means = groups.map((g) => {
		let s = 0;
		for (let i = 0; i < g.length; i++) s += g[i];
		return s / g.length;
	});
	const grand = means.reduce((s, m, i) => s + m * sizes[i], 0) / n;
	let between = 0;
	let within = 0;
	groups.forEach((g, j) => {
		between += sizes[j] * (means[j] - grand) ** 2;
		for (let i = 0; i < g.length; i++) within += (g[i] - means[j]) ** 2;
	});
	return anovaFrom(sizes, between, within, grand);
}

/** p/q for BigInts, to the nearest double or so (both converted at most once past 2^53). */
function ratio(p: bigint, q: bigint): number {
	const whole = p / q;
	const rest = p - whole * q;
	return Number(whole) + Number(rest) / Number(q);
}

/**
 * oneWayAnova of groups held as counts. When every group sits on one grid under one line (a
 * meter's readings: cover = a + b·step·k), the sums of squares come from each group's whole-number
 * sums S1 = Σc·k and S2 = Σc·k²: within = Σ (n_j·S2_j − S1_j²)/n_j and between =
 * Σ (N·S1_j − n_j·S1)²/(n_j·N²), each term an exact whole-number ratio and never negative, so
 * the only rounding is one division a term (no cancellation, unlike the readings' own pass, which
 * this matches to its rounding: tests/unit/analysis/countedMembers.test.ts). Off a grid, the same
 * two weighted passes over the distinct values. Cost O(Σ D_j).
 */
export function oneWayAnovaCounted(groups: readonly CountedSample[]): OneWayAnovaResult {
	const sizes = groups.map((g) => g.n);
	requireGroups(sizes);
	const n = sizes.reduce((s, x) => s + x, 0);
	const first = groups[0].lattice;
	const shared =
		first !== null &&
		groups.every(
			(g) =>
				g.lattice !== null &&
				g.lattice.a === first.a &&
				g.lattice.b === first.b &&
				g.lattice.grid.den === first.grid.den &&
				g.lattice.grid.factor === first.grid.factor
		);
	if (shared) {
		const sums = groups.map((g) => {
			let s1 = 0n;
			let s2 = 0n;
			for (let i = 0; i < g.counts.length; i++) {
				const k = BigInt(g.lattice!.steps[i]);
				const c = BigInt(g.counts[i]);
				s1 += c * k;
				s2 += c * k * k;
			}
			return { s1, s2, n: BigInt(g.n) };
		});
		const bigN = BigInt(n);
		const total = sums.reduce((s, x) => s + x.s1, 0n);
		const unit = (first.b * first.grid.factor) / first.grid.den;
		let within = 0;
		let between = 0;
		for (const g of sums) {
			within += ratio(g.n * g.s2 - g.s1 * g.s1, g.n);
			const d = bigN * g.s1 - g.n * total;
			between += ratio(d * d, g.n * bigN * bigN);
		}
		return anovaFrom(
			sizes,
			unit * unit * between,
			unit * unit * within,
			first.a + unit * ratio(total, bigN)
		);
	}
	const means = groups.map((g) => {
		let s = 0;
		for (let i = 0; i < g.values.length; i++) s += g.counts[i] * g.values[i];
		return s / g.n;
	});
	const grand = means.reduce((s, m, i) => s + m * sizes[i], 0) / n;
	let between = 0;
	let within = 0;
	groups.forEach((g, j) => {
		between += sizes[j] * (means[j] - grand) ** 2;
		for (let i = 0; i < g.values.length; i++) within += g.counts[i] * (g.values[i] - means[j]) ** 2;
	});
	return anovaFrom(sizes, between, within, grand);
}
