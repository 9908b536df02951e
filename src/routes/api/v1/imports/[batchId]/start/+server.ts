import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { authorize } from '$lib/server/web/actor';
import { readJson } from '$lib/server/web/http';
import { importKindOf, startImport } from '$lib/server/import/batches';
import { startSchemaFor } from '$lib/server/import/measurements/mapping';
import { api } from '$lib/server/web/respond';
import { pathId } from '$lib/server/web/params';

/** Step 2: the mapping and choices; the import runs on, and GET /api/v1/imports/:id follows it. */
export const POST: RequestHandler = async ({ locals, params, request }) => {
	const actor = authorize(locals, 'reading:import');
	const batchId = pathId(params.batchId);
	// The mapping's fields depend on what the file holds: readings, or a kind of measurement.
	const kind = await api(() => importKindOf(actor, batchId));
	const input = await readJson(request, startSchemaFor(kind));
	const started = await api(() => startImport(actor, batchId, input));
	// Not awaited: it settles in the batch's row, which the progress route reads.
	void started.done.catch((err) => console.error(`import ${batchId} crashed:`, err));
	return json({ import: { id: batchId, state: 'running' } }, { status: 202 });
};
