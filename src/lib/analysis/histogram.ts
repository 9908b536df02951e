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

/** Where a histogram's bins lie: the first bin's start, the width and the number of bins. */
export interface HistogramLayout {
	startMm: number;
	widthMm: number;
	bins: number;
}

/**
 * The bins of a histogram of n readings from minMm to maxMm whose type 7 IQR is `iqr` (asked
 * for only when the Freedman–Diaconis rule needs it), or of fixed width `binWidthMm` anchored at a
 * multiple of the width (at most 1000 bins). Shared by the sorted and the counted histogram so
 * both bin alike.
 */
export function histogramLayout(
	n: number,
	minMm: number,
	maxMm: number,
	iqr: () => number,
	binWidthMm?: number
): HistogramLayout {
	if (binWidthMm !== undefined) {
		if (!(binWidthMm > 0)) throw new Error('histogram needs a bin width above 0 mm');
		const startMm = Math.floor(minMm / binWidthMm) * binWidthMm;
		const bins = Math.max(
			1,
			Math.ceil((maxMm - startMm) / binWidthMm) + (maxMm === startMm ? 1 : 0)
		);
		if (bins > 1000) throw new Error('histogram bin width gives more than 1000 bins');
		return { startMm, widthMm: binWidthMm, bins };
	}
	if (!(maxMm > minMm)) return { startMm: minMm, widthMm: 1, bins: 1 };
	const bins = freedmanDiaconisBins(n, maxMm - minMm, iqr());
	return { startMm: minMm, widthMm: (maxMm - minMm) / bins, bins };
}

/** Empty bins of a layout. */
export function emptyBins({ startMm, widthMm, bins }: HistogramLayout): HistogramBin[] {
	const out: HistogramBin[] = [];
	for (let b = 0; b < bins; b++) {
		out.push({ fromMm: startMm + b * widthMm, toMm: startMm + (b + 1) * widthMm, count: 0 });
	}
	return out;
}

/** The bin a value falls in ([from, to), the last one closed). */
export function binOf(valueMm: number, { startMm, widthMm, bins }: HistogramLayout): number {
	return Math.min(bins - 1, Math.floor((valueMm - startMm) / widthMm));
}

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
	const layout = histogramLayout(
		n,
		sorted[0],
		sorted[n - 1],
		() => percentileSorted(sorted, 0.75) - percentileSorted(sorted, 0.25),
		binWidthMm
	);
	const out = emptyBins(layout);
	for (let i = 0; i < n; i++) out[binOf(sorted[i], layout)].count++;
	return out;
}

/**
 * histogramSorted of a population held as counts: the same bins, each distinct value's
 * readings falling into the bin its value falls into. Cost O(D).
 */
export function histogramCounted(sample: CountedSample, binWidthMm?: number): HistogramBin[] {
	const { n, values, counts } = sample;
	requireReadings('histogram', n, 1);
	const layout = histogramLayout(
		n,
		values[0],
		values[values.length - 1],
		() => percentileCounted(sample, 0.75) - percentileCounted(sample, 0.25),
		binWidthMm
	);
	const out = emptyBins(layout);
	for (let i = 0; i < values.length; i++) out[binOf(values[i], layout)].count += counts[i];
	return out;
}
