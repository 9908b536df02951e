import type { RequestHandler } from './$types';
import { authorize } from '$lib/server/web/actor';
import { readingsExportResponse } from '$lib/server/research/exportResponse';
import { filterOf } from '$lib/server/web/researchQuery';

/** The selected readings, streamed as JSON Lines; recorded in research_exports. */
export const GET: RequestHandler = async ({ locals, url }) => {
	const actor = authorize(locals, 'research:export');
	return readingsExportResponse(actor, filterOf(url), 'readings-jsonl');
};
