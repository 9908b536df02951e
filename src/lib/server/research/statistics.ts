import type { Sequelize } from 'sequelize';
import { ENGINE_VERSION, type FractionBelow } from '$lib/analysis';
import type { GroupKey, ResearchFilter } from './filter';
import { gatherGroups, type GroupValues } from './groups';
import { populationFiguresCounted, shareBelowCounted, type PopulationFigures } from './population';

/** Statistics of one population of the selection: cover, deviation from nominal, below c_min. */
export interface GroupStatistics {
	key: GroupValues['key'];
	readingCount: number;
	memberCount: number;
	assetCount: number;
	cover: PopulationFigures | null;
	deviationFromNominal: PopulationFigures | null;
	/** Readings with measured cover below their member's c_min (margin below 0 mm). */
	belowCMin: FractionBelow | null;
}

export interface ResearchStatistics {
	engineVersion: string;
	filter: ResearchFilter;
	groupBy: GroupKey[];
	selection: GroupStatistics;
	groups: GroupStatistics[];
}

export interface StatisticsOptions {
	groupBy: GroupKey[];
	fractileP?: number;
	confidence?: number;
	/** Chart data for the whole selection (cover and deviation); groups never carry charts. */
	charts?: boolean;
}

function groupStatistics(group: GroupValues, options: StatisticsOptions, charts: boolean) {
	const figureOptions = { fractileP: options.fractileP, confidence: options.confidence, charts };
	return {
		key: group.key,
		readingCount: group.readingCount,
		memberCount: group.memberIds.size,
		assetCount: group.assetIds.size,
		cover: populationFiguresCounted(group.coversMm.toCounted(), figureOptions),
		deviationFromNominal: populationFiguresCounted(group.deviationsMm.toCounted(), figureOptions),
		belowCMin: shareBelowCounted(group.marginsMm.toCounted(), 0, options.confidence)
	};
}

/**
 * The engine's statistics for the research selection and for each group within it, from the
 * members' stored counts (no reading is read). Statistics name no member or asset, so nothing
 * is pseudonymised: members and assets are only counted.
 */
export async function researchStatistics(
	sequelize: Sequelize,
	filter: ResearchFilter,
	options: StatisticsOptions
): Promise<ResearchStatistics> {
	const { all, groups } = await gatherGroups(sequelize, filter, options.groupBy);
	return {
		engineVersion: ENGINE_VERSION,
		filter,
		groupBy: options.groupBy,
		selection: groupStatistics(all, options, options.charts ?? false),
		groups: groups.map((g) => groupStatistics(g, options, false))
	};
}
