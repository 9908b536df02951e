/**
 * A two-component normal mixture fitted by EM, for populations neither single model fits
 * ("two populations, for example a patch of low cover").
 * Reference: A. P. Dempster, N. M. Laird & D. B. Rubin, "Maximum likelihood from incomplete
 * data via the EM algorithm", JRSS B 39 (1977) 1–38; G. McLachlan & D. Peel, Finite Mixture
 * Models (Wiley 2000) §2.8 (the normal mixture's E and M steps), §6.9 (BIC); R. E. Kass & A. E.
 * Raftery, "Bayes factors", JASA 90 (1995) 773–795 (a BIC difference above 10 is very strong).
 * Our own: simple-statistics' ckmeans clusters but fits no mixture, and jstat has none.
 */
import { type CountedSample, countedFromSorted, percentileCounted } from './countedSample';
import { mulberry32 } from './durability/prng';
import { normalPdf } from './normalDistribution';
import { requireReadings } from './readings';

export interface MixtureComponent {
	share: number;
	meanMm: number;
	sdMm: number;
}

export interface NormalMixture {
	/** The lower component (smaller mean) first. */
	components: [MixtureComponent, MixtureComponent];
	logLikelihood: number;
	/** Log-likelihood after each iteration of the best start (never decreases under EM). */
	trace: number[];
	iterations: number;
	/** |ΔlnL| < tolerance·|lnL| reached before maxIterations. */
	converged: boolean;
	tolerance: number;
	seed: number;
	starts: number;
	/** BIC = −2 lnL + p ln n: one normal (p = 2) and the mixture (p = 5); lower is better. */
	bicOneComponent: number;
	bicTwoComponents: number;
	/** The mixture's BIC is lower by more than 10 ("very strong", Kass & Raftery 1995). */
	twoComponentsPreferred: boolean;
}

export interface MixtureOptions {
	seed?: number;
	/** Random starts besides the quartile start (default 4). */
	starts?: number;
	maxIterations?: number;
	tolerance?: number;
}

interface Values {
	x: Float64Array;
	w: Float64Array;
	n: number;
}

type Params = [MixtureComponent, MixtureComponent];

function density(c: MixtureComponent, x: number): number {
	return (c.share * normalPdf((x - c.meanMm) / c.sdMm)) / c.sdMm;
}

function logLikelihood(v: Values, p: Params): number {
	let ll = 0;
	for (let i = 0; i < v.x.length; i++)
		ll += v.w[i] * Math.log(density(p[0], v.x[i]) + density(p[1], v.x[i]));
	return ll;
}

/**
 * One E step and M step in one pass (values are centred on the overall mean, so the second
 * moments lose nothing to cancellation). Returns the new parameters and lnL of the old ones.
 * `floorMm` keeps a component from collapsing onto one value.
 */
function emStep(v: Values, p: Params, floorMm: number): { next: Params; ll: number } {
	let s0 = 0;
	let s1 = 0;
	let f0 = 0;
	let f1 = 0;
	let q0 = 0;
	let q1 = 0;
	let ll = 0;
	for (let i = 0; i < v.x.length; i++) {
		const x = v.x[i];
		const a = density(p[0], x);
		const b = density(p[1], x);
		const r = a + b > 0 ? a / (a + b) : 0.5;
		ll += v.w[i] * Math.log(a + b);
		const w0 = v.w[i] * r;
		const w1 = v.w[i] - w0;
		s0 += w0;
		s1 += w1;
		f0 += w0 * x;
		f1 += w1 * x;
		q0 += w0 * x * x;
		q1 += w1 * x * x;
	}
	const m0 = f0 / s0;
	const m1 = f1 / s1;
	const next: Params = [
		{
			share: s0 / v.n,
			meanMm: m0,
			sdMm: Math.max(floorMm, Math.sqrt(Math.max(0, q0 / s0 - m0 * m0)))
		},
		{
			share: s1 / v.n,
			meanMm: m1,
			sdMm: Math.max(floorMm, Math.sqrt(Math.max(0, q1 / s1 - m1 * m1)))
		}
	];
	return { next, ll };
}

function runEm(
	v: Values,
	start: Params,
	floorMm: number,
	maxIterations: number,
	tolerance: number
) {
	let p = start;
	const trace: number[] = [];
	let converged = false;
	for (let it = 0; it < maxIterations; it++) {
		const { next, ll } = emStep(v, p, floorMm);
		trace.push(ll);
		const previous = trace.length > 1 ? trace[trace.length - 2] : -Infinity;
		p = next;
		if (Math.abs(ll - previous) < tolerance * Math.abs(ll)) {
			converged = true;
			break;
		}
	}
	const ll = logLikelihood(v, p);
	trace.push(ll);
	return { p, ll, trace, converged };
}

/** The distinct values centred on their mean (a copy), and that mean and SD (divisor n). */
function centred(sample: CountedSample): { v: Values; mean: number; sd: number } {
	const v: Values = { x: Float64Array.from(sample.values), w: sample.counts, n: sample.n };
	let mean = 0;
	for (let i = 0; i < v.x.length; i++) mean += v.w[i] * v.x[i];
	mean /= v.n;
	let squares = 0;
	for (let i = 0; i < v.x.length; i++) {
		v.x[i] -= mean;
		squares += v.w[i] * v.x[i] * v.x[i];
	}
	return { v, mean, sd: Math.sqrt(squares / v.n) };
}

/**
 * Fit a two-component normal mixture to sorted readings (mm): the readings are counted and
 * fitted by fitNormalMixtureCounted, which works on distinct values only (one code path).
 * @example fitNormalMixture(sorted, { seed: 1 }).components[0].meanMm // the low component
 */
export function fitNormalMixture(
	sorted: Float64Array,
	options: MixtureOptions = {}
): NormalMixture {
	requireReadings('fitNormalMixture', sorted.length, 10);
	return fitNormalMixtureCounted(countedFromSorted(sorted), options);
}

/**
 * Fit a two-component normal mixture by EM, each distinct value weighted by its count (the
 * likelihood of the readings expanded, term for term), from a quartile start and `starts` seeded
 * random starts (mulberry32), keeping the highest log-likelihood. BIC against one normal. Cost
 * O(distinct values × iterations × starts), whatever the number of readings. Needs 10 readings
 * with spread.
 * @example fitNormalMixtureCounted(sample, { seed: 1 }).components[0].meanMm // the low component
 */
export function fitNormalMixtureCounted(
	sample: CountedSample,
	options: MixtureOptions = {}
): NormalMixture {
	requireReadings('fitNormalMixture', sample.n, 10);
	const seed = options.seed ?? 1;
	const starts = options.starts ?? 4;
	const maxIterations = options.maxIterations ?? 1000;
	const tolerance = options.tolerance ?? 1e-8;
	const { v, mean, sd } = centred(sample);
	if (v.x.length < 2) throw new Error('fitNormalMixture needs readings with some spread');
	const floorMm = 1e-3 * sd;
	const random = mulberry32(seed);
	const quantile = (p: number) => percentileCounted(sample, p, 7);
	const initial: Params[] = [
		[
			{ share: 0.5, meanMm: quantile(0.25) - mean, sdMm: sd / 2 },
			{ share: 0.5, meanMm: quantile(0.75) - mean, sdMm: sd / 2 }
		]
	];
	for (let s = 0; s < starts; s++) {
		const share = 0.1 + 0.8 * random();
		initial.push([
			{
				share,
				meanMm: quantile(random()) - mean,
				sdMm: sd * (0.3 + 0.7 * random())
			},
			{
				share: 1 - share,
				meanMm: quantile(random()) - mean,
				sdMm: sd * (0.3 + 0.7 * random())
			}
		]);
	}
	const runs = initial.map((start) => runEm(v, start, floorMm, maxIterations, tolerance));
	const best = runs.reduce((a, b) => (b.ll > a.ll ? b : a));
	const components = best.p
		.map((c) => ({ ...c, meanMm: c.meanMm + mean }))
		.sort((a, b) => a.meanMm - b.meanMm) as Params;
	const oneLl = v.n * (-0.5 * Math.log(2 * Math.PI * sd * sd) - 0.5);
	const bicOneComponent = -2 * oneLl + 2 * Math.log(v.n);
	const bicTwoComponents = -2 * best.ll + 5 * Math.log(v.n);
	return {
		components,
		logLikelihood: best.ll,
		trace: best.trace,
		iterations: best.trace.length - 1,
		converged: best.converged,
		tolerance,
		seed,
		starts: initial.length,
		bicOneComponent,
		bicTwoComponents,
		twoComponentsPreferred: bicTwoComponents < bicOneComponent - 10
	};
}

/** P(low | x) for one reading, and a side when both densities underflow. */
function lowPosterior(mixture: Pick<NormalMixture, 'components'>, x: number): number {
	const [low, high] = mixture.components;
	const a = density(low, x);
	const b = density(high, x);
	return a + b > 0 ? a / (a + b) : x < (low.meanMm + high.meanMm) / 2 ? 1 : 0;
}

/**
 * Share of a set of readings the mixture assigns to its low component: the mean posterior
 * probability P(low | x). Cost O(n).
 * @example lowComponentShare(mixture, memberCovers) // 0.93: this member carries the low patch
 */
export function lowComponentShare(
	mixture: Pick<NormalMixture, 'components'>,
	coversMm: Float64Array
): number {
	if (coversMm.length === 0) return 0;
	let sum = 0;
	for (let i = 0; i < coversMm.length; i++) sum += lowPosterior(mixture, coversMm[i]);
	return sum / coversMm.length;
}

/**
 * lowComponentShare of readings held as counts: Σ count·P(low | value) / n. Equal to the
 * readings' own sum up to the order of additions (1e-12 relative at most, tested). Cost O(D).
 */
export function lowComponentShareCounted(
	mixture: Pick<NormalMixture, 'components'>,
	sample: CountedSample
): number {
	if (sample.n === 0) return 0;
	let sum = 0;
	for (let i = 0; i < sample.values.length; i++)
		sum += sample.counts[i] * lowPosterior(mixture, sample.values[i]);
	return sum / sample.n;
}
