import type { RequestHandler } from './$types';
import { authorize } from '$lib/server/policy';
import { groupsExportResponse } from '$lib/server/research/exportResponse';
import { statisticsQueryOf } from '$lib/server/research/requests';

/** The group statistics of the selection as CSV; recorded in research_exports. */
export const GET: RequestHandler = async ({ locals, url }) => {
	const actor = authorize(locals, 'research:export');
	const { groupBy, charts: _charts, ...filter } = statisticsQueryOf(url);
	void _charts;
	return groupsExportResponse(actor, filter, groupBy);
};
