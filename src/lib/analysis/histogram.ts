/**
 * Histogram bins for charts.
 */
import { type CountedSample, percentileCounted } from './countedSample';
import { percentileSorted } from './percentile';
import { requireReadings } from './readings';

export const MIN_BINS = 5;
export const MAX_BINS = 100;

export interface HistogramBin {
	fromMm: number;
	toMm: number;
	count: number;
}

/**
 * Bin width by Freedman & Diaconis (1981), Z. Wahrscheinlichkeitstheorie 57: h = 2·IQR·n^(−1/3),
 * the IQR by type 7 percentiles; the bin count is held between 5 and 100 (our limits, so a chart
 * stays readable), and Sturges' ⌈log2 n⌉ + 1 bins are used when the IQR is 0.
 */
function freedmanDiaconisBins(n: number, range: number, iqr: number): number {
	const bins =
		iqr > 0 ? Math.ceil(range / (2 * iqr * Math.cbrt(1 / n))) : Math.ceil(Math.log2(n)) + 1;
	return Math.min(MAX_BINS, Math.max(MIN_BINS, bins));
}

interface BinLayout {
	startMm: number;
	widthMm: number;
	bins: HistogramBin[];
}

/** The empty bins for readings from minMm to maxMm (the IQR asked for only when needed). */
function layout(
	n: number,
	minMm: number,
	maxMm: number,
	iqr: () => number,
	binWidthMm?: number
): BinLayout {
	let startMm: number;
	let widthMm: number;
	let count: number;
	if (binWidthMm !== undefined) {
		if (!(binWidthMm > 0)) throw new Error('histogram needs a bin width above 0 mm');
		startMm = Math.floor(minMm / binWidthMm) * binWidthMm;
		widthMm = binWidthMm;
		count = Math.max(1, Math.ceil((maxMm - startMm) / widthMm) + (maxMm === startMm ? 1 : 0));
		if (count > 1000) throw new Error('histogram bin width gives more than 1000 bins');
	} else {
		count = maxMm > minMm ? freedmanDiaconisBins(n, maxMm - minMm, iqr()) : 1;
		startMm = minMm;
		widthMm = maxMm > minMm ? (maxMm - minMm) / count : 1;
	}
	const bins: HistogramBin[] = [];
	for (let b = 0; b < count; b++) {
		bins.push({ fromMm: startMm + b * widthMm, toMm: startMm + (b + 1) * widthMm, count: 0 });
	}
	return { startMm, widthMm, bins };
}

const binOf = (l: BinLayout, x: number) =>
	Math.min(l.bins.length - 1, Math.floor((x - l.startMm) / l.widthMm));

/**
 * Histogram of sorted readings. Bins are [from, to), the last one closed.
 * Default: Freedman–Diaconis within 5…100 bins spanning min…max. With `binWidthMm` fixed-width
 * bins anchored at a multiple of the width (at most 1000 bins). Units mm. Cost O(n), one pass.
 * Needs 1 reading.
 * @example histogramSorted(Float64Array.of(1, 2, 2, 3), 1) // [{fromMm:1,toMm:2,count:1}, {2,3,3}]
 */
export function histogramSorted(sorted: Float64Array, binWidthMm?: number): HistogramBin[] {
	const n = sorted.length;
	requireReadings('histogram', n, 1);
	const l = layout(
		n,
		sorted[0],
		sorted[n - 1],
		() => percentileSorted(sorted, 0.75) - percentileSorted(sorted, 0.25),
		binWidthMm
	);
	for (let i = 0; i < n; i++) l.bins[binOf(l, sorted[i])].count++;
	return l.bins;
}

/**
 * histogramSorted of a population held as counts: the same bins, each distinct value's
 * readings falling into the bin its value falls into. Cost O(D).
 */
export function histogramCounted(sample: CountedSample, binWidthMm?: number): HistogramBin[] {
	const { n, values, counts } = sample;
	requireReadings('histogram', n, 1);
	const l = layout(
		n,
		values[0],
		values[values.length - 1],
		() => percentileCounted(sample, 0.75) - percentileCounted(sample, 0.25),
		binWidthMm
	);
	for (let i = 0; i < values.length; i++) l.bins[binOf(l, values[i])].count += counts[i];
	return l.bins;
}
