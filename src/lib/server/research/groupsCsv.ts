import { GROUP_KEYS, type GroupKey } from './filter';
import { csvLine } from '$lib/csv';
import type { GroupStatistics, ResearchStatistics } from './statistics';
import type { PopulationFigures } from './population';

/**
 * The group statistics as CSV: one line for the whole selection, then one a group. Every figure
 * is the engine's (statistics.ts); this file only lays them out. Columns are listed in
 * GROUP_STAT_COLUMNS and described in the data dictionary.
 */
const percentile = (f: PopulationFigures | null, p: number) =>
	f?.percentiles.find((q) => Math.abs(q.p - p) < 1e-9)?.valueMm ?? null;

const FIGURES: [string, (g: GroupStatistics) => number | string | boolean | null][] = [
	['readingCount', (g) => g.readingCount],
	['memberCount', (g) => g.memberCount],
	['assetCount', (g) => g.assetCount],
	['coverMeanMm', (g) => g.cover?.description.meanMm ?? null],
	['coverSdMm', (g) => g.cover?.description.sdMm ?? null],
	['coverMinMm', (g) => g.cover?.description.minMm ?? null],
	['coverP5Mm', (g) => percentile(g.cover, 0.05)],
	['coverP50Mm', (g) => percentile(g.cover, 0.5)],
	['coverP95Mm', (g) => percentile(g.cover, 0.95)],
	['coverMaxMm', (g) => g.cover?.description.maxMm ?? null],
	['coverCharacteristicPredictionMm', (g) => g.cover?.characteristic.normal.predictionMm ?? null],
	['coverBetterModel', (g) => g.cover?.models.better ?? null],
	['coverNormalRejected', (g) => g.cover?.models.normal.rejected ?? null],
	['coverLognormalRejected', (g) => g.cover?.models.lognormal?.rejected ?? null],
	['deviationMeanMm', (g) => g.deviationFromNominal?.description.meanMm ?? null],
	['deviationSdMm', (g) => g.deviationFromNominal?.description.sdMm ?? null],
	['deviationP5Mm', (g) => percentile(g.deviationFromNominal, 0.05)],
	['deviationP50Mm', (g) => percentile(g.deviationFromNominal, 0.5)],
	['deviationP95Mm', (g) => percentile(g.deviationFromNominal, 0.95)],
	['belowCMinCount', (g) => g.belowCMin?.count ?? null],
	['belowCMinFraction', (g) => g.belowCMin?.empirical ?? null],
	['belowCMinUpperBound', (g) => g.belowCMin?.upperBound ?? null]
];

/**
 * A figure without binary floating-point noise: 12 significant digits keep every digit a cover
 * meter (0.1 mm) or a fraction can carry, and drop the tail of sums such as -8.899999999999999
 * (IEEE 754 doubles hold 15–17 significant digits, so the last ones are rounding, not data).
 */
export function tidyFigure<T>(value: T): T | number {
	return typeof value === 'number' && Number.isFinite(value)
		? Number(value.toPrecision(12))
		: value;
}

export const GROUP_STAT_COLUMNS = ['population', ...GROUP_KEYS, ...FIGURES.map(([name]) => name)];

function line(label: string, g: GroupStatistics, groupBy: readonly GroupKey[]): string {
	const keys = GROUP_KEYS.map((k) => (groupBy.includes(k) ? (g.key[k] ?? null) : null));
	return csvLine([label, ...keys, ...FIGURES.map(([, value]) => tidyFigure(value(g)))]);
}

export function groupStatisticsCsv(stats: ResearchStatistics): string {
	let text = csvLine(GROUP_STAT_COLUMNS) + line('selection', stats.selection, []);
	for (const group of stats.groups) text += line('group', group, stats.groupBy);
	return text;
}
