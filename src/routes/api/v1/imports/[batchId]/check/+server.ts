import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { authorize } from '$lib/server/policy';
import { readJson } from '$lib/server/http';
import { checkPreviewRows, importCheckSchema } from '$lib/server/import/checkRows';
import { api, idParam } from '$lib/server/intake/respond';

/** The preview's rows read with a mapping and units not yet started: what the import would write. */
export const POST: RequestHandler = async ({ locals, params, request }) => {
	const actor = authorize(locals, 'reading:import');
	const batchId = idParam(params.batchId);
	const input = await readJson(request, importCheckSchema);
	return json({ rows: await api(() => checkPreviewRows(actor, batchId, input)) });
};
