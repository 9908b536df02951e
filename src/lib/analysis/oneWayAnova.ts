/**
 * One-way analysis of variance across groups, with the between- and within-group SDs.
 * References: scipy.stats.f_oneway (the F test); the variance components by the method of
 * moments for unbalanced groups, S. R. Searle, G. Casella & C. E. McCulloch, Variance
 * Components (Wiley 1992) §3.6, Eq. 3.6.3 with n₀ = (N − Σn_i²/N)/(k − 1) (as ISO 5725-2
 * separates between- and within-laboratory variance). Our own: the packages have no ANOVA.
 */
import jStat from 'jstat';

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

/**
 * One-way ANOVA of groups of readings (mm). Cost O(N), two passes. Needs 2 groups and more
 * readings than groups.
 * @example oneWayAnova([a, b, c]).pValue // as scipy.stats.f_oneway(a, b, c).pvalue
 */
export function oneWayAnova(
	groups: readonly (readonly number[] | Float64Array)[]
): OneWayAnovaResult {
	const k = groups.length;
	const sizes = groups.map((g) => g.length);
	const n = sizes.reduce((s, x) => s + x, 0);
	if (k < 2 || sizes.some((x) => x === 0) || n <= k)
		throw new Error(
			'oneWayAnova needs at least 2 groups, each with a reading, and more readings than groups'
		);
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
