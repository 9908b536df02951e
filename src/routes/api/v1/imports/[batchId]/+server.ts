import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { authorize } from '$lib/server/web/actor';
import { importStatus } from '$lib/server/import/batchActions';
import { api } from '$lib/server/web/respond';
import { pathId } from '$lib/server/web/params';

/** State and progress of an import, from MariaDB: any app process can answer it. */
export const GET: RequestHandler = async ({ locals, params }) => {
	const actor = authorize(locals, 'survey:read');
	return json({ import: await api(() => importStatus(actor, pathId(params.batchId))) });
};
