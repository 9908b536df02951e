import {
	characteristicCovers,
	characteristicCoversCounted,
	compareModels,
	compareModelsCounted,
	describeCounted,
	ecdfPointsCounted,
	histogramCounted,
	normalProbabilityPlotCounted,
	fractionBelowCounted,
	percentileCounted,
	type CountedSample,
	describeSorted,
	ecdfPoints,
	fractionBelow,
	histogramSorted,
	modelCurves,
	normalProbabilityPlot,
	percentileSorted,
	toPlainJson,
	toSortedValues,
	type ChartData,
	type CharacteristicCovers,
	type CoverDescription,
	type FractionBelow,
	type ModelComparison
} from '$lib/analysis';

/**
 * The engine's figures for one research population of values in mm: a cover population, or the
 * deviation from nominal (measured − c_nom), or the margin over c_min. All statistics come from
 * src/lib/analysis; this file only chooses which to ask for. Values may be negative (a
 * deviation), in which case the engine fits no lognormal model.
 */
export const RESEARCH_PERCENTILES = [0.05, 0.1, 0.25, 0.5, 0.75, 0.9, 0.95];

export interface PopulationFigures {
	description: CoverDescription;
	percentiles: { p: number; valueMm: number }[];
	models: ModelComparison;
	characteristic: CharacteristicCovers;
	charts: ChartData | null;
}

export interface PopulationOptions {
	fractileP?: number;
	confidence?: number;
	charts?: boolean;
}

/** The engine's figures, or null when there are fewer than 2 values (the engine's minimum). */
export function populationFigures(
	valuesMm: readonly number[] | Float64Array,
	options: PopulationOptions = {}
): PopulationFigures | null {
	if (valuesMm.length < 2) return null;
	const sorted = toSortedValues(valuesMm);
	const models = compareModels(sorted);
	const characteristic = characteristicCovers(
		sorted,
		models.normal,
		models.lognormal,
		options.fractileP ?? 0.05,
		options.confidence ?? 0.95
	);
	return toPlainJson({
		description: describeSorted(sorted),
		percentiles: RESEARCH_PERCENTILES.map((p) => ({ p, valueMm: percentileSorted(sorted, p) })),
		models,
		characteristic,
		charts: options.charts ? researchCharts(sorted, models) : null
	});
}

/** The fitted curves over the data's own range, lowest to highest value. */
function researchCurves(minMm: number, maxMm: number, models: ModelComparison) {
	const padMm = 0.1 * (maxMm - minMm || 1);
	const fromMm = minMm - padMm;
	const fits = models.lognormal ? [models.normal, models.lognormal] : [models.normal];
	return fits.flatMap((fit) =>
		modelCurves(fit, fit.model === 'lognormal' ? Math.max(fromMm, 0.1) : fromMm, maxMm + padMm)
	);
}

/**
 * The engine's chart pieces, over the data's own range: the engine's `chartData` starts curves
 * at 0 mm, which would cut off the negative half of a deviation population.
 */
function researchCharts(sorted: Float64Array, models: ModelComparison): ChartData {
	return {
		histogram: histogramSorted(sorted),
		ecdf: ecdfPoints(sorted),
		curves: researchCurves(sorted[0], sorted[sorted.length - 1], models),
		probabilityPlot: normalProbabilityPlot(sorted)
	};
}

/** researchCharts from counts: the same pieces, without expanding the readings. */
function researchChartsCounted(sample: CountedSample, models: ModelComparison): ChartData {
	return {
		histogram: histogramCounted(sample),
		ecdf: ecdfPointsCounted(sample),
		curves: researchCurves(sample.values[0], sample.values[sample.values.length - 1], models),
		probabilityPlot: normalProbabilityPlotCounted(sample)
	};
}

/** Share of values below a limit with its Clopper–Pearson interval (engine), or null if n < 2. */
export function shareBelow(
	valuesMm: readonly number[] | Float64Array,
	limitMm: number,
	confidence = 0.95
): FractionBelow | null {
	if (valuesMm.length < 2) return null;
	const sorted = toSortedValues(valuesMm);
	const models = compareModels(sorted);
	return toPlainJson(fractionBelow(sorted, limitMm, models.normal, models.lognormal, confidence));
}

/**
 * populationFigures of a population held as counts: the same figures, charts included, in time
 * and memory of the distinct values.
 */
export function populationFiguresCounted(
	sample: CountedSample,
	options: PopulationOptions = {}
): PopulationFigures | null {
	if (sample.n < 2) return null;
	const models = compareModelsCounted(sample);
	const characteristic = characteristicCoversCounted(
		sample,
		models.normal,
		models.lognormal,
		options.fractileP ?? 0.05,
		options.confidence ?? 0.95
	);
	return toPlainJson({
		description: describeCounted(sample),
		percentiles: RESEARCH_PERCENTILES.map((p) => ({ p, valueMm: percentileCounted(sample, p) })),
		models,
		characteristic,
		charts: options.charts ? researchChartsCounted(sample, models) : null
	});
}

/** shareBelow of a population held as counts. */
export function shareBelowCounted(
	sample: CountedSample,
	limitMm: number,
	confidence = 0.95
): FractionBelow | null {
	if (sample.n < 2) return null;
	const models = compareModelsCounted(sample);
	return toPlainJson(
		fractionBelowCounted(sample, limitMm, models.normal, models.lognormal, confidence)
	);
}
