import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { authorize } from '$lib/server/web/actor';
import { undoImport } from '$lib/server/import/batchActions';
import { api, idParam } from '$lib/server/web/respond';

/** Removes exactly the readings this import wrote (audited). */
export const POST: RequestHandler = async ({ locals, params }) => {
	const actor = authorize(locals, 'reading:edit');
	const rowsDeleted = await api(() => undoImport(actor, idParam(params.batchId)));
	return json({ rowsDeleted });
};
