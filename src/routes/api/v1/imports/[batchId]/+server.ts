import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { authorize } from '$lib/server/web/actor';
import { importStatus } from '$lib/server/import/batchActions';
import { api, idParam } from '$lib/server/web/respond';

/** State and progress of an import, from MariaDB: any app process can answer it. */
export const GET: RequestHandler = async ({ locals, params }) => {
	const actor = authorize(locals, 'survey:read');
	return json({ import: await api(() => importStatus(actor, idParam(params.batchId))) });
};
