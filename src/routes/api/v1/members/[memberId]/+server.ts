import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { authorize } from '$lib/server/web/actor';
import { readJson } from '$lib/server/web/http';
import { memberSchema } from '$lib/intake/schemas';
import { updateMember } from '$lib/server/intake/members';
import { scopedMember } from '$lib/server/scope';
import { api, idParam } from '$lib/server/web/respond';

export const GET: RequestHandler = async ({ locals, params }) => {
	const actor = authorize(locals, 'survey:read');
	const { member } = await api(() => scopedMember(actor, idParam(params.memberId), 'read'));
	return json({ member });
};

export const PUT: RequestHandler = async ({ locals, params, request }) => {
	const actor = authorize(locals, 'member:write');
	const id = idParam(params.memberId);
	const input = await readJson(request, memberSchema);
	return json({ member: await api(() => updateMember(actor, id, input)) });
};
