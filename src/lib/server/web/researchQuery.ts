import { readQuery } from './query';
import { statisticsInput, statisticsQuerySchema } from '../research/apiSchemas';
import { filterInput, researchFilterSchema, type ResearchFilter } from '../research/filter';

/** The research filter (and grouping) of a request's query string, validated by zod. */
export function filterOf(url: URL): ResearchFilter {
	return readQuery(researchFilterSchema, filterInput(url.searchParams));
}

export function statisticsQueryOf(url: URL) {
	return readQuery(statisticsQuerySchema, statisticsInput(url.searchParams));
}
