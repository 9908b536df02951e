import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { authorize } from '$lib/server/web/actor';
import { readJson } from '$lib/server/web/http';
import { chlorideProfileSchema } from '$lib/intake/measurements';
import { createChlorideProfile, listChlorideProfiles } from '$lib/server/intake/chloride';
import { api } from '$lib/server/web/respond';
import { pathId } from '$lib/server/web/params';

export const GET: RequestHandler = async ({ locals, params }) => {
	const actor = authorize(locals, 'survey:read');
	const id = pathId(params.memberId);
	return json({ chlorideProfiles: await api(() => listChlorideProfiles(actor, id)) });
};

export const POST: RequestHandler = async ({ locals, params, request }) => {
	const actor = authorize(locals, 'measurement:write');
	const id = pathId(params.memberId);
	const input = await readJson(request, chlorideProfileSchema);
	const chlorideProfile = await api(() => createChlorideProfile(actor, id, input));
	return json({ chlorideProfile }, { status: 201 });
};
