/**
 * The chart pieces of charts.ts and histogram.ts drawn from a population held as counts
 * (countedSample.ts): the same bins, the same thinned order statistics and plotting positions as
 * from the readings expanded and sorted, in time and memory of the distinct values rather than
 * of the readings (a selection of 10^8 readings would otherwise be expanded to 800 MB to plot).
 * tests/unit/analysis/countedCharts.test.ts checks each against its sorted twin.
 */
import { type ChartData, plottingScore, thinnedIndices } from './charts';
import { percentileCounted, type CountedSample } from './countedSample';
import { binOf, emptyBins, histogramLayout, type HistogramBin } from './histogram';
import { requireReadings } from './readings';

/** histogramSorted of the readings behind the counts. Cost O(distinct values + bins). */
export function histogramCounted(sample: CountedSample, binWidthMm?: number): HistogramBin[] {
	const { values, counts, n } = sample;
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

/**
 * The values at the given ascending 0-based positions of the sorted readings, by one walk
 * along the cumulative counts. Cost O(distinct values + positions).
 */
function valuesAt(sample: CountedSample, positions: readonly number[]): number[] {
	const out: number[] = [];
	let d = 0;
	let below = 0; // readings before values[d]
	for (const i of positions) {
		while (i >= below + sample.counts[d]) below += sample.counts[d++];
		out.push(sample.values[d]);
	}
	return out;
}

/** ecdfPoints of the readings behind the counts. Cost O(distinct values + maxPoints). */
export function ecdfPointsCounted(sample: CountedSample, maxPoints = 500): ChartData['ecdf'] {
	const n = sample.n;
	requireReadings('ecdfPoints', n, 1);
	const positions = thinnedIndices(n, maxPoints);
	const values = valuesAt(sample, positions);
	return positions.map((i, j) => ({ coverMm: values[j], fraction: (i + 1) / n }));
}

/** normalProbabilityPlot of the readings behind the counts. Cost O(distinct values + maxPoints). */
export function normalProbabilityPlotCounted(
	sample: CountedSample,
	maxPoints = 500
): ChartData['probabilityPlot'] {
	const n = sample.n;
	requireReadings('normalProbabilityPlot', n, 1);
	const positions = thinnedIndices(n, maxPoints);
	const values = valuesAt(sample, positions);
	return positions.map((i, j) => ({ normalScore: plottingScore(i, n), coverMm: values[j] }));
}
