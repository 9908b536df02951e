import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { authorize } from '$lib/server/web/actor';
import { listMembers } from '$lib/server/organisation/members';

/** The members of the caller's active organisation, with their roles (admins only). */
export const GET: RequestHandler = async ({ locals }) => {
	const actor = authorize(locals, 'organisation:manage');
	return json({ members: await listMembers(actor.organisationId) });
};
