import type { RequestHandler } from './$types';
import { authorize } from '$lib/server/web/actor';
import { groupsExportResponse } from '$lib/server/research/exportResponse';
import { statisticsQueryOf } from '$lib/server/web/researchQuery';

/** The group statistics of the selection as CSV; recorded in research_exports. */
export const GET: RequestHandler = async ({ locals, url }) => {
	const actor = authorize(locals, 'research:export');
	// Charts have no place in a CSV: the option is read (and validated) but not used.
	const { groupBy, charts, ...filter } = statisticsQueryOf(url);
	void charts;
	return groupsExportResponse(actor, filter, groupBy);
};
