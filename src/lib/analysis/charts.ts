/**
 * Chart data, kept apart from the assessment so an overview of many groups does not pay for it.
 * Every point list is thinned to at most `maxPoints` so a million readings plot quickly.
 */
import { type FittedModel, modelCdf, modelPdf } from './fitModels';
import { type CountedSample, orderStatisticsCounted } from './countedSample';
import { histogramCounted, histogramSorted, type HistogramBin } from './histogram';
import { normalQuantile } from './normalDistribution';
import { requireReadings } from './readings';

export interface ChartData {
	histogram: HistogramBin[];
	ecdf: { coverMm: number; fraction: number }[];
	curves: { model: FittedModel['model']; coverMm: number; pdf: number; cdf: number }[];
	probabilityPlot: { normalScore: number; coverMm: number }[];
}

/** Indices 0…n−1 thinned to at most maxPoints, always keeping the first and last. */
export function thinnedIndices(n: number, maxPoints: number): number[] {
	if (n <= maxPoints) return Array.from({ length: n }, (_, i) => i);
	const step = (n - 1) / (maxPoints - 1);
	return Array.from({ length: maxPoints }, (_, j) => Math.round(j * step));
}

/**
 * Empirical CDF points (x(i), i/n), thinned. Definition F_n(x) = #{x_j ≤ x}/n.
 * Cost O(maxPoints). @example ecdfPoints(Float64Array.of(1, 2)) // [{1, 0.5}, {2, 1}]
 */
export function ecdfPoints(sorted: Float64Array, maxPoints = 500): ChartData['ecdf'] {
	requireReadings('ecdfPoints', sorted.length, 1);
	return ecdfOf(sorted.length, (indices) => indices.map((i) => sorted[i]), maxPoints);
}

/** Order statistics at ascending 0-based indices, from sorted readings or from counts. */
type OrderStatistics = (indices: number[]) => number[];

function ecdfOf(n: number, at: OrderStatistics, maxPoints: number): ChartData['ecdf'] {
	const indices = thinnedIndices(n, maxPoints);
	const covers = at(indices);
	return indices.map((i, j) => ({ coverMm: covers[j], fraction: (i + 1) / n }));
}

function probabilityPlotOf(
	n: number,
	at: OrderStatistics,
	maxPoints: number
): ChartData['probabilityPlot'] {
	const indices = thinnedIndices(n, maxPoints);
	const covers = at(indices);
	return indices.map((i, j) => ({ normalScore: plottingScore(i, n), coverMm: covers[j] }));
}

/**
 * Fitted pdf (1/mm) and cdf on an even grid of `points` covers from fromMm to toMm.
 * Cost O(points). @example modelCurves(fit, 20, 90, 141)
 */
export function modelCurves(
	fit: FittedModel,
	fromMm: number,
	toMm: number,
	points = 200
): ChartData['curves'] {
	const out: ChartData['curves'] = [];
	for (let i = 0; i < points; i++) {
		const coverMm = fromMm + ((toMm - fromMm) * i) / Math.max(1, points - 1);
		out.push({
			model: fit.model,
			coverMm,
			pdf: modelPdf(fit, coverMm),
			cdf: modelCdf(fit, coverMm)
		});
	}
	return out;
}

/** The normal score of the (i+1)-th of n ordered values, by ppoints' positions (below). */
export function plottingScore(i: number, n: number): number {
	const a = n <= 10 ? 3 / 8 : 1 / 2;
	return normalQuantile((i + 1 - a) / (n + 1 - 2 * a));
}

/**
 * Normal probability plot points (normal score, x(i)) with R's ppoints plotting positions
 * (i − a)/(n + 1 − 2a), a = 3/8 for n ≤ 10, else 1/2 (R ?ppoints; Blom 1958). Thinned.
 * Cost O(maxPoints) normal quantiles.
 */
export function normalProbabilityPlot(
	sorted: Float64Array,
	maxPoints = 500
): ChartData['probabilityPlot'] {
	requireReadings('normalProbabilityPlot', sorted.length, 1);
	return probabilityPlotOf(sorted.length, (indices) => indices.map((i) => sorted[i]), maxPoints);
}

/**
 * All chart data for a population: histogram (Freedman–Diaconis or fixed width), ECDF, fitted
 * curves for each model given, normal probability plot. Cost O(n) for the histogram, the rest
 * O(points).
 */
export function chartData(
	sorted: Float64Array,
	models: readonly FittedModel[],
	binWidthMm?: number,
	maxPoints = 500
): ChartData {
	const n = sorted.length;
	const padMm = 0.1 * (sorted[n - 1] - sorted[0] || 1);
	return {
		histogram: histogramSorted(sorted, binWidthMm),
		ecdf: ecdfPoints(sorted, maxPoints),
		curves: models.flatMap((m) =>
			modelCurves(m, Math.max(0, sorted[0] - padMm), sorted[n - 1] + padMm)
		),
		probabilityPlot: normalProbabilityPlot(sorted, maxPoints)
	};
}

/** ecdfPoints of the readings behind the counts. Cost O(distinct values + maxPoints). */
export function ecdfPointsCounted(sample: CountedSample, maxPoints = 500): ChartData['ecdf'] {
	requireReadings('ecdfPoints', sample.n, 1);
	return ecdfOf(sample.n, (indices) => orderStatisticsCounted(sample, indices), maxPoints);
}

/** normalProbabilityPlot of the readings behind the counts. Cost O(distinct values + maxPoints). */
export function normalProbabilityPlotCounted(
	sample: CountedSample,
	maxPoints = 500
): ChartData['probabilityPlot'] {
	requireReadings('normalProbabilityPlot', sample.n, 1);
	return probabilityPlotOf(
		sample.n,
		(indices) => orderStatisticsCounted(sample, indices),
		maxPoints
	);
}

/**
 * chartData of a population held as counts: the same histogram, ECDF, curves and probability
 * plot as from the readings expanded (the thinned points are order statistics, read from the
 * cumulative counts). Cost O(D + points).
 */
export function chartDataCounted(
	sample: CountedSample,
	models: readonly FittedModel[],
	binWidthMm?: number,
	maxPoints = 500
): ChartData {
	const { n, values } = sample;
	requireReadings('chartData', n, 1);
	const lo = values[0];
	const hi = values[values.length - 1];
	const padMm = 0.1 * (hi - lo || 1);
	const at: OrderStatistics = (indices) => orderStatisticsCounted(sample, indices);
	return {
		histogram: histogramCounted(sample, binWidthMm),
		ecdf: ecdfOf(n, at, maxPoints),
		curves: models.flatMap((m) => modelCurves(m, Math.max(0, lo - padMm), hi + padMm)),
		probabilityPlot: probabilityPlotOf(n, at, maxPoints)
	};
}
