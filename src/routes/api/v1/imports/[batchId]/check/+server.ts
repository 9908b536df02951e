import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { authorize } from '$lib/server/web/actor';
import { readJson } from '$lib/server/web/http';
import { checkPreviewRows, importCheckSchema } from '$lib/server/import/checkRows';
import { api } from '$lib/server/web/respond';
import { pathId } from '$lib/server/web/params';

/** The preview's rows read with a mapping and units not yet started: what the import would write. */
export const POST: RequestHandler = async ({ locals, params, request }) => {
	const actor = authorize(locals, 'reading:import');
	const batchId = pathId(params.batchId);
	const input = await readJson(request, importCheckSchema);
	return json({ rows: await api(() => checkPreviewRows(actor, batchId, input)) });
};
