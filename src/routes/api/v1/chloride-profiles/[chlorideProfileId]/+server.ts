import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { authorize } from '$lib/server/web/actor';
import { deleteChlorideProfile, getChlorideProfile } from '$lib/server/intake/chloride';
import { api } from '$lib/server/web/respond';
import { pathId } from '$lib/server/web/params';

export const GET: RequestHandler = async ({ locals, params }) => {
	const actor = authorize(locals, 'survey:read');
	const id = pathId(params.chlorideProfileId);
	return json({ chlorideProfile: await api(() => getChlorideProfile(actor, id)) });
};

/** Removes a profile recorded in error, with its increments (audited). */
export const DELETE: RequestHandler = async ({ locals, params }) => {
	const actor = authorize(locals, 'measurement:write');
	const id = pathId(params.chlorideProfileId);
	await api(() => deleteChlorideProfile(actor, id));
	return new Response(null, { status: 204 });
};
