import { parseInput } from '../api/request';
import { statisticsInput, statisticsQuerySchema } from './apiSchemas';
import { filterInput, researchFilterSchema, type ResearchFilter } from './filter';

/** The research filter (and grouping) of a request's query string, validated by zod. */
export function filterOf(url: URL): ResearchFilter {
	return parseInput(researchFilterSchema, filterInput(url.searchParams));
}

export function statisticsQueryOf(url: URL) {
	return parseInput(statisticsQuerySchema, statisticsInput(url.searchParams));
}
