import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { authorize } from '$lib/server/web/actor';
import { ResearchExport } from '$lib/server/db';
import { summariseExport } from '$lib/server/research/exportRecord';

/** The exports of the caller's organisation, newest first (the last 200). */
export const GET: RequestHandler = async ({ locals }) => {
	const actor = authorize(locals, 'research:export');
	const rows = await ResearchExport.findAll({
		where: { organisationId: actor.organisationId },
		order: [['id', 'DESC']],
		limit: 200
	});
	return json({ exports: rows.map(summariseExport) });
};
