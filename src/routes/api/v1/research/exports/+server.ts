import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { authorize } from '$lib/server/web/actor';
import { exportsOf } from '$lib/server/research/exportRecord';

/** The exports of the caller's organisation, newest first (the last 200). */
export const GET: RequestHandler = async ({ locals }) => {
	const actor = authorize(locals, 'research:export');
	return json({ exports: await exportsOf(actor.organisationId) });
};
