import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { authorize } from '$lib/server/web/actor';
import { cancelImport } from '$lib/server/import/batchActions';
import { api } from '$lib/server/web/respond';
import { pathId } from '$lib/server/web/params';

export const POST: RequestHandler = async ({ locals, params }) => {
	const actor = authorize(locals, 'reading:import');
	await api(() => cancelImport(actor, pathId(params.batchId)));
	return json({ cancelRequested: true }, { status: 202 });
};
