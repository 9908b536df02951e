import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { authorize } from '$lib/server/web/actor';
import { undoImport } from '$lib/server/import/batchActions';
import { api } from '$lib/server/web/respond';
import { pathId } from '$lib/server/web/params';

/** Removes exactly the readings this import wrote (audited). */
export const POST: RequestHandler = async ({ locals, params }) => {
	const actor = authorize(locals, 'reading:edit');
	const rowsDeleted = await api(() => undoImport(actor, pathId(params.batchId)));
	return json({ rowsDeleted });
};
