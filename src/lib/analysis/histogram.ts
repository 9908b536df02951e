/**
 * Histogram bins for charts.
 */
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
function freedmanDiaconisBins(sorted: Float64Array): number {
	const n = sorted.length;
	const range = sorted[n - 1] - sorted[0];
	const iqr = percentileSorted(sorted, 0.75) - percentileSorted(sorted, 0.25);
	const bins =
		iqr > 0 ? Math.ceil(range / (2 * iqr * Math.cbrt(1 / n))) : Math.ceil(Math.log2(n)) + 1;
	return Math.min(MAX_BINS, Math.max(MIN_BINS, bins));
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
	const minMm = sorted[0];
	const maxMm = sorted[n - 1];
	let startMm: number;
	let widthMm: number;
	let bins: number;
	if (binWidthMm !== undefined) {
		if (!(binWidthMm > 0)) throw new Error('histogram needs a bin width above 0 mm');
		startMm = Math.floor(minMm / binWidthMm) * binWidthMm;
		widthMm = binWidthMm;
		bins = Math.max(1, Math.ceil((maxMm - startMm) / widthMm) + (maxMm === startMm ? 1 : 0));
		if (bins > 1000) throw new Error('histogram bin width gives more than 1000 bins');
	} else {
		bins = maxMm > minMm ? freedmanDiaconisBins(sorted) : 1;
		startMm = minMm;
		widthMm = maxMm > minMm ? (maxMm - minMm) / bins : 1;
	}
	const out: HistogramBin[] = [];
	for (let b = 0; b < bins; b++) {
		out.push({ fromMm: startMm + b * widthMm, toMm: startMm + (b + 1) * widthMm, count: 0 });
	}
	for (let i = 0; i < n; i++) {
		const b = Math.min(bins - 1, Math.floor((sorted[i] - startMm) / widthMm));
		out[b].count++;
	}
	return out;
}
