import type { RequestHandler } from './$types';
import { authorize } from '$lib/server/web/actor';
import { apiError } from '$lib/server/web/http';
import { rejectedRowsCsv } from '$lib/server/import/batchActions';
import { api } from '$lib/server/web/respond';
import { pathId } from '$lib/server/web/params';
import { contentDisposition } from '$lib/server/storage/names';

/** The rows an import refused, with row number and reason, as CSV (formulas neutralised). */
export const GET: RequestHandler = async ({ locals, params }) => {
	const actor = authorize(locals, 'survey:read');
	const batchId = pathId(params.batchId);
	const csv = await api(() => rejectedRowsCsv(actor, batchId));
	if (csv == null) apiError(404, 'not_found', 'This import rejected no rows.');
	return new Response(csv, {
		headers: {
			'content-type': 'text/csv; charset=utf-8',
			'content-disposition': contentDisposition(`rejected-rows-import-${batchId}.csv`, 'attachment')
		}
	});
};
