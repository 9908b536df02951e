import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { authorize } from '$lib/server/web/actor';
import { readJson } from '$lib/server/web/http';
import { startImport } from '$lib/server/import/batches';
import { importStartSchema } from '$lib/server/import/mapping';
import { api } from '$lib/server/web/respond';
import { pathId } from '$lib/server/web/params';

/** Step 2: the mapping and choices; the import runs on, and GET /api/v1/imports/:id follows it. */
export const POST: RequestHandler = async ({ locals, params, request }) => {
	const actor = authorize(locals, 'reading:import');
	const batchId = pathId(params.batchId);
	const input = await readJson(request, importStartSchema);
	const started = await api(() => startImport(actor, batchId, input));
	// Not awaited: it settles in the batch's row, which the progress route reads.
	void started.done.catch((err) => console.error(`import ${batchId} crashed:`, err));
	return json({ import: { id: batchId, state: 'running' } }, { status: 202 });
};
