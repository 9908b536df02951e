import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { authorize } from '$lib/server/policy';
import { apiError, readJson } from '$lib/server/http';
import { manualEntrySchema } from '$lib/intake/schemas';
import { saveManualReadings } from '$lib/server/intake/manualEntry';
import { api, idParam } from '$lib/server/intake/respond';

/** Readings from the entry grid, through the import path: all saved, or none and why. */
export const POST: RequestHandler = async ({ locals, params, request }) => {
	const actor = authorize(locals, 'reading:edit');
	const id = idParam(params.memberId);
	const entry = await readJson(request, manualEntrySchema);
	const outcome = await api(() => saveManualReadings(actor, id, entry));
	if (outcome.state !== 'completed') apiError(400, 'rows-rejected', outcome.message);
	return json(outcome, { status: 201 });
};
