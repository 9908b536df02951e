/**
 * A population held as counts: each distinct cover once, with how many readings have it. A
 * cover meter logs on a grid (0.1 or 1 mm), so a population of 10^8 readings has a few thousand
 * distinct values, and every figure below costs the number of distinct values, not of readings.
 * Each function gives what its sorted-array twin gives from the same readings expanded
 * (tests/unit/analysis/countedSample.test.ts checks each against it on random quantized data):
 * order statistics, counts and interpolations to the bit; sums from exact integer arithmetic on
 * the grid (BigInt), which is at least as exact as summing the doubles.
 * Our own code: simple-statistics and jstat take raw arrays only.
 */
import { characteristicCoversFromFactors, type CharacteristicCovers } from './characteristicCover';
import { type CoverGrid, detectGrid, gridSteps, gridValue } from './coverGrid';
import type { CoverDescription } from './describe';
import type { AndersonDarlingResult } from './andersonDarling';
import { andersonDarlingPValue } from './andersonDarling';
import { fractionBelowFromCounts, type FractionBelow } from './fractionBelow';
import type { FittedModel } from './fitModels';
import { type KolmogorovSmirnovResult, lillieforsPValue } from './lilliefors';
import { type ModelProbabilities, modelProbabilities } from './modelProbabilities';
import type { PercentileType } from './percentile';
import { requireReadings } from './readings';

export interface CountedSample {
	/** Distinct values, ascending (mm). */
	values: Float64Array;
	/** Readings at each value (whole numbers, each ≥ 1). */
	counts: Float64Array;
	/** Σ counts. */
	n: number;
	/**
	 * When the values are a + b·(grid value of k): the grid, its steps k per value and the map.
	 * Sums then run on the whole numbers k exactly. A meter's readings have a = 0, b = 1; a
	 * calibrated population keeps the meter's grid and carries its line.
	 */
	lattice: { grid: CoverGrid; steps: Float64Array; a: number; b: number } | null;
}

function withLattice(values: Float64Array, counts: Float64Array, grid?: CoverGrid | null) {
	let n = 0;
	for (let i = 0; i < counts.length; i++) n += counts[i];
	const found = grid === undefined ? detectGrid(values) : grid;
	let lattice: CountedSample['lattice'] = null;
	if (found) {
		const steps = new Float64Array(values.length);
		let ok = true;
		for (let i = 0; i < values.length && ok; i++) {
			const k = gridSteps(values[i], found);
			if (k === null) ok = false;
			else steps[i] = k;
		}
		if (ok) lattice = { grid: found, steps, a: 0, b: 1 };
	}
	return { values, counts, n, lattice };
}

/**
 * Counts of sorted readings. Cost O(n).
 * @example countedFromSorted(Float64Array.of(40, 40, 41)).counts // Float64Array [2, 1]
 */
export function countedFromSorted(sorted: Float64Array, grid?: CoverGrid | null): CountedSample {
	const values: number[] = [];
	const counts: number[] = [];
	for (let i = 0; i < sorted.length; i++) {
		if (i > 0 && sorted[i] < sorted[i - 1])
			throw new Error('countedFromSorted needs ascending readings');
		if (values.length > 0 && values[values.length - 1] === sorted[i]) counts[counts.length - 1]++;
		else {
			values.push(sorted[i]);
			counts.push(1);
		}
	}
	return withLattice(Float64Array.from(values), Float64Array.from(counts), grid);
}

/**
 * Counts gathered in a Map (value → readings) as a counted sample. Cost O(D log D).
 * @example countedFromTally(new Map([[41, 1], [40, 2]])).values // Float64Array [40, 41]
 */
export function countedFromTally(tally: ReadonlyMap<number, number>): CountedSample {
	const values = Float64Array.from(tally.keys()).sort();
	const counts = new Float64Array(values.length);
	for (let i = 0; i < values.length; i++) counts[i] = tally.get(values[i])!;
	return withLattice(values, counts);
}

/**
 * One population from several (members into a group): counts of equal values add. When every
 * part sits on one grid (the usual case) the counts add into an array indexed by grid step,
 * O(D + range) for D entries in all; otherwise through a Map, O(D log D). The grid is kept
 * when every part shares it.
 */
export function mergeCounted(parts: readonly CountedSample[]): CountedSample {
	const first = parts[0]?.lattice;
	const shared =
		first &&
		first.a === 0 &&
		first.b === 1 &&
		parts.every(
			(p) =>
				p.lattice?.a === 0 &&
				p.lattice.b === 1 &&
				p.lattice.grid.den === first.grid.den &&
				p.lattice.grid.factor === first.grid.factor
		);
	if (shared) {
		const merged = mergeOnGrid(parts, first.grid);
		if (merged) return merged;
	}
	const tally = new Map<number, number>();
	for (const part of parts)
		for (let i = 0; i < part.values.length; i++)
			tally.set(part.values[i], (tally.get(part.values[i]) ?? 0) + part.counts[i]);
	const values = Float64Array.from(tally.keys()).sort();
	const counts = new Float64Array(values.length);
	for (let i = 0; i < values.length; i++) counts[i] = tally.get(values[i])!;
	return withLattice(values, counts, shared ? first.grid : undefined);
}

/** Steps spanned by one dense tally at most (8 bytes a step: 64 MB), past which a Map is used. */
const DENSE_STEPS = 2 ** 23;

/** Counted sample from a dense tally over steps kLo … kLo + tally.length − 1. */
function fromStepTally(tally: Float64Array, kLo: number, grid: CoverGrid): CountedSample {
	let distinct = 0;
	let n = 0;
	for (let j = 0; j < tally.length; j++) {
		if (tally[j] > 0) distinct++;
		n += tally[j];
	}
	const values = new Float64Array(distinct);
	const counts = new Float64Array(distinct);
	const steps = new Float64Array(distinct);
	for (let j = 0, d = 0; j < tally.length; j++) {
		if (tally[j] === 0) continue;
		steps[d] = kLo + j;
		values[d] = gridValue(kLo + j, grid);
		counts[d++] = tally[j];
	}
	return { values, counts, n, lattice: { grid, steps, a: 0, b: 1 } };
}

/** Parts on one grid added step by step; null when their steps span too wide a range. */
function mergeOnGrid(parts: readonly CountedSample[], grid: CoverGrid): CountedSample | null {
	let kLo = Infinity;
	let kHi = -Infinity;
	for (const part of parts) {
		const steps = part.lattice!.steps;
		if (steps.length === 0) continue;
		kLo = Math.min(kLo, steps[0]);
		kHi = Math.max(kHi, steps[steps.length - 1]);
	}
	if (kLo > kHi) return fromStepTally(new Float64Array(0), 0, grid);
	if (kHi - kLo >= DENSE_STEPS) return null;
	const tally = new Float64Array(kHi - kLo + 1);
	for (const part of parts) {
		const steps = part.lattice!.steps;
		for (let i = 0; i < steps.length; i++) tally[steps[i] - kLo] += part.counts[i];
	}
	return fromStepTally(tally, kLo, grid);
}

/**
 * Counts of raw readings logged on a known grid, by one counting pass: each reading's step
 * k = round(x / factor · den), checked to reproduce the reading to the bit, tallied in an array
 * indexed by k. O(n + range of steps), no sort — numpy's partition is the peer. Readings off the
 * grid, or spread over more than 2^23 steps, are sorted and counted instead (O(n log n)), so
 * the answer is the same counted sample either way.
 * @example countedFromGridReadings(Float64Array.of(40.1, 39.9, 40.1), { den: 10, factor: 1 }).counts // [1, 2]
 */
export function countedFromGridReadings(readings: Float64Array, grid: CoverGrid): CountedSample {
	let lo = Infinity;
	let hi = -Infinity;
	for (let i = 0; i < readings.length; i++) {
		const x = readings[i];
		if (x < lo) lo = x;
		if (x > hi) hi = x;
	}
	if (readings.length === 0) return fromStepTally(new Float64Array(0), 0, grid);
	const kLo = gridSteps(lo, grid);
	const kHi = gridSteps(hi, grid);
	if (kLo === null || kHi === null || kHi - kLo >= DENSE_STEPS)
		return countedFromSorted(Float64Array.from(readings).sort());
	const tally = new Float64Array(kHi - kLo + 1);
	const perMm = grid.den / grid.factor;
	for (let i = 0; i < readings.length; i++) {
		const x = readings[i];
		const k = Math.round(x * perMm);
		// The quick k is checked as the stored reading; a reading it misses takes the slow path.
		if (k < kLo || k > kHi || gridValue(k, grid) !== x) {
			const exact = gridSteps(x, grid);
			if (exact === null) return countedFromSorted(Float64Array.from(readings).sort());
			tally[exact - kLo]++;
		} else tally[k - kLo]++;
	}
	return fromStepTally(tally, kLo, grid);
}

/**
 * Order statistics x(i + 1) for ascending 0-based indices, in one walk of the counts (the
 * chart points of a counted population). Cost O(D + indices).
 */
export function orderStatisticsCounted(
	sample: CountedSample,
	indices: readonly number[]
): number[] {
	const out: number[] = [];
	let j = 0;
	let through = sample.counts.length > 0 ? sample.counts[0] : 0;
	for (const i of indices) {
		while (through <= i && j < sample.counts.length - 1) through += sample.counts[++j];
		out.push(sample.values[j]);
	}
	return out;
}

/** The readings again, sorted (for the figures that still need them). Cost O(n). */
export function expandCounted(sample: CountedSample): Float64Array {
	const out = new Float64Array(sample.n);
	let at = 0;
	for (let i = 0; i < sample.values.length; i++) {
		out.fill(sample.values[i], at, at + sample.counts[i]);
		at += sample.counts[i];
	}
	return out;
}

/**
 * The population through a line a + b·x (a calibration), b > 0: each distinct value maps as
 * each reading would, counts unchanged, and the grid is kept under the line, so sums stay exact.
 */
export function mapCounted(sample: CountedSample, a: number, b: number): CountedSample {
	if (!(b > 0)) throw new Error('mapCounted needs a rising line (b > 0)');
	const values = sample.values.map((v) => a + b * v);
	const lattice = sample.lattice
		? { ...sample.lattice, a: a + b * sample.lattice.a, b: b * sample.lattice.b }
		: null;
	return { values, counts: sample.counts, n: sample.n, lattice };
}

/** Index of the first distinct value not passing `passes` (values ascending). */
function firstFailing(values: Float64Array, passes: (v: number) => boolean): number {
	let lo = 0;
	let hi = values.length;
	while (lo < hi) {
		const mid = (lo + hi) >>> 1;
		if (passes(values[mid])) lo = mid + 1;
		else hi = mid;
	}
	return lo;
}

/** Readings strictly below the limit. Cost O(log D) to find the values, O(D) to add counts. */
export function countBelowCounted(sample: CountedSample, limit: number): number {
	const end = firstFailing(sample.values, (v) => v < limit);
	let below = 0;
	for (let i = 0; i < end; i++) below += sample.counts[i];
	return below;
}

/** Readings at or below the limit. */
export function countAtOrBelowCounted(sample: CountedSample, limit: number): number {
	const end = firstFailing(sample.values, (v) => v <= limit);
	let at = 0;
	for (let i = 0; i < end; i++) at += sample.counts[i];
	return at;
}

/** Cumulative counts: cumulative[i] readings at or below values[i]. */
function cumulativeOf(sample: CountedSample): Float64Array {
	const cumulative = new Float64Array(sample.values.length);
	let total = 0;
	for (let i = 0; i < sample.counts.length; i++) cumulative[i] = total += sample.counts[i];
	return cumulative;
}

/** The i-th order statistic x(i), 1-based, by binary search of the cumulative counts. */
function orderStatistic(sample: CountedSample, cumulative: Float64Array, i: number): number {
	let lo = 0;
	let hi = cumulative.length - 1;
	while (lo < hi) {
		const mid = (lo + hi) >>> 1;
		if (cumulative[mid] < i) lo = mid + 1;
		else hi = mid;
	}
	return sample.values[lo];
}

/**
 * The p-quantile of types 6 or 7 (Hyndman & Fan 1996), the same interpolation between the
 * same order statistics as percentileSorted. Cost O(log D) after one O(D) pass.
 */
export function percentileCounted(
	sample: CountedSample,
	p: number,
	type: PercentileType = 7
): number {
	const n = sample.n;
	requireReadings('percentile', n, 1);
	if (!(p >= 0 && p <= 1)) throw new Error('percentile needs 0 ≤ p ≤ 1');
	if (type !== 6 && type !== 7) throw new Error(`percentile type must be 6 or 7, not ${type}`);
	const cumulative = cumulativeOf(sample);
	const h = type === 7 ? (n - 1) * p + 1 : (n + 1) * p;
	if (h <= 1) return sample.values[0];
	if (h >= n) return sample.values[sample.values.length - 1];
	const lower = Math.floor(h);
	const fraction = h - lower;
	const a = orderStatistic(sample, cumulative, lower);
	const b = orderStatistic(sample, cumulative, lower + 1);
	return a + fraction * (b - a);
}

export interface CountedMoments {
	n: number;
	mean: number;
	/** Sample SD, divisor n − 1 (0 for one reading or none spread). */
	sd: number;
}

/**
 * n, mean and SD. On a grid: from Σc·k and Σc·k² in whole numbers (BigInt), so the only
 * rounding is the final division — mean = a + b·f·S1/(den·n), var = (b·f/den)²·(n·S2 − S1²)/(n(n−1)).
 * Off a grid: two passes over the distinct values, weighted.
 */
export function momentsCounted(sample: CountedSample): CountedMoments {
	const { n, values, counts, lattice } = sample;
	requireReadings('moments', n, 1);
	if (values.length === 1 || n < 2) return { n, mean: values[0], sd: 0 };
	if (lattice) {
		let s1 = 0n;
		let s2 = 0n;
		for (let i = 0; i < counts.length; i++) {
			const k = BigInt(lattice.steps[i]);
			const c = BigInt(counts[i]);
			s1 += c * k;
			s2 += c * k * k;
		}
		const bn = BigInt(n);
		const unit = (lattice.b * lattice.grid.factor) / lattice.grid.den;
		const mean = lattice.a + unit * ratio(s1, bn);
		const variance = unit * unit * ratio(bn * s2 - s1 * s1, bn * (bn - 1n));
		return { n, mean, sd: Math.sqrt(variance) };
	}
	let sum = 0;
	for (let i = 0; i < values.length; i++) sum += counts[i] * values[i];
	const mean = sum / n;
	let squares = 0;
	for (let i = 0; i < values.length; i++) squares += counts[i] * (values[i] - mean) ** 2;
	return { n, mean, sd: Math.sqrt(squares / (n - 1)) };
}

/** p/q for BigInts, to the nearest double (both converted at most once past 2^53). */
function ratio(p: bigint, q: bigint): number {
	const whole = p / q;
	const rest = p - whole * q;
	return Number(whole) + Number(rest) / Number(q);
}

/** Mean and SD of ln x, weighted (the lognormal fit). */
function logMoments(sample: CountedSample): [number, number] {
	const { n, values, counts } = sample;
	if (values.length === 1) return [Math.log(values[0]), 0];
	let sum = 0;
	for (let i = 0; i < values.length; i++) sum += counts[i] * Math.log(values[i]);
	const mean = sum / n;
	let squares = 0;
	for (let i = 0; i < values.length; i++) squares += counts[i] * (Math.log(values[i]) - mean) ** 2;
	return [mean, Math.sqrt(squares / (n - 1))];
}

/** fitNormal of the expanded readings: μ = mean, σ = sample SD. */
export function fitNormalCounted(sample: CountedSample): FittedModel {
	requireReadings('fitNormal', sample.n, 2);
	const { mean, sd } = momentsCounted(sample);
	return { model: 'normal', location: mean, scale: sd };
}

/** fitLognormal of the expanded readings: mean and sample SD of ln x. */
export function fitLognormalCounted(sample: CountedSample): FittedModel {
	requireReadings('fitLognormal', sample.n, 2);
	if (!(sample.values[0] > 0)) throw new Error('fitLognormal needs every reading above 0 mm');
	const [location, scale] = logMoments(sample);
	return { model: 'lognormal', location, scale };
}

/** describeSorted of the expanded readings. Cost O(D). */
export function describeCounted(sample: CountedSample, type: PercentileType = 7): CoverDescription {
	const { n, values, counts } = sample;
	requireReadings('describe', n, 2);
	const { mean, sd } = momentsCounted(sample);
	let skewness: number | null = null;
	if (n >= 3 && sd > 0) {
		// Adjusted G1 as simple-statistics' sampleSkewness: n·Σd³ / ((n−1)(n−2)·s³), s from Σd².
		let squares = 0;
		let cubes = 0;
		for (let i = 0; i < values.length; i++) {
			const d = values[i] - mean;
			squares += counts[i] * d * d;
			cubes += counts[i] * d * d * d;
		}
		const s = Math.sqrt(squares / (n - 1));
		skewness = (n * cubes) / ((n - 1) * (n - 2) * s ** 3);
	}
	return {
		n,
		meanMm: mean,
		sdMm: sd,
		cov: sd === 0 ? 0 : sd / mean,
		minMm: values[0],
		maxMm: values[values.length - 1],
		medianMm: percentileCounted(sample, 0.5, type),
		skewness
	};
}

/**
 * Kolmogorov–Smirnov distance against a fitted model with ties: within a run of equal
 * readings x(a+1) … x(b) the model CDF is one value F, so the largest i/n − F is b/n − F and
 * the largest F − (i−1)/n is F − a/n. Lilliefors p-value as kolmogorovSmirnov. Cost O(D).
 */
export function kolmogorovSmirnovCounted(
	sample: CountedSample,
	fit: FittedModel,
	probabilities: ModelProbabilities = modelProbabilities(sample.values, fit)
): KolmogorovSmirnovResult {
	const { n, values, counts } = sample;
	requireReadings('kolmogorovSmirnov', n, 5);
	const { cdf } = probabilities;
	let d = 0;
	let before = 0;
	for (let j = 0; j < values.length; j++) {
		const after = before + counts[j];
		d = Math.max(d, after / n - cdf[j], cdf[j] - before / n);
		before = after;
	}
	return { statistic: d, pValue: lillieforsPValue(d, n) };
}

/**
 * Anderson–Darling A² with ties: the sum Σ(2i−1)[ln F(x(i)) + ln(1 − F(x(n+1−i)))] taken a run
 * of equal readings at a time — Σ over i = a+1 … b of (2i − 1) is b² − a², and the survival
 * terms take their weights 2n − 2i + 1 likewise. Same statistic, modified form and p-value as
 * andersonDarling. Cost O(D).
 */
export function andersonDarlingCounted(
	sample: CountedSample,
	fit: FittedModel,
	probabilities: ModelProbabilities = modelProbabilities(sample.values, fit)
): AndersonDarlingResult {
	const { n, values, counts } = sample;
	requireReadings('andersonDarling', n, 8);
	const { logCdf, logSurvival } = probabilities;
	let sum = 0;
	let before = 0;
	for (let j = 0; j < values.length; j++) {
		const a = before;
		const b = before + counts[j];
		// Readings a+1 … b (1-based) carry weight 2i − 1 on ln F; reading i's survival term
		// pairs with weight 2(n + 1 − i) − 1 = 2n − 2i + 1.
		const cdfWeight = b * b - a * a;
		const survivalWeight = (b - a) * (2 * n + 1) - (b * (b + 1) - a * (a + 1));
		sum += cdfWeight * logCdf[j] + survivalWeight * logSurvival[j];
		before = b;
	}
	const statistic = -n - sum / n;
	const modified = statistic * (1 + 0.75 / n + 2.25 / (n * n));
	return { statistic, modified, pValue: andersonDarlingPValue(modified) };
}

/** fractionBelow of the expanded readings (count from the counts, then the same formulas). */
export function fractionBelowCounted(
	sample: CountedSample,
	limitMm: number,
	normal: FittedModel,
	lognormal: FittedModel | null,
	confidence = 0.95
): FractionBelow {
	requireReadings('fractionBelow', sample.n, 2);
	return fractionBelowFromCounts(
		countBelowCounted(sample, limitMm),
		sample.n,
		limitMm,
		normal,
		lognormal,
		confidence
	);
}

/** characteristicCovers of the expanded readings. */
export function characteristicCoversCounted(
	sample: CountedSample,
	normal: FittedModel,
	lognormal: FittedModel | null,
	p = 0.05,
	confidence = 0.95,
	type: PercentileType = 7
): CharacteristicCovers {
	requireReadings('characteristicCovers', sample.n, 2);
	return characteristicCoversFromFactors(
		sample.n,
		percentileCounted(sample, p, type),
		normal,
		lognormal,
		p,
		confidence
	);
}

/** The grid value of k as stored: re-exported for the server's codec. */
export { gridValue };
