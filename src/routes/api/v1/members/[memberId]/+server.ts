import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { authorize } from '$lib/server/web/actor';
import { readJson } from '$lib/server/web/http';
import { memberSchema } from '$lib/intake/schemas';
import { updateMember } from '$lib/server/intake/members';
import { scopedMember } from '$lib/server/access';
import { api } from '$lib/server/web/respond';
import { pathId } from '$lib/server/web/params';

export const GET: RequestHandler = async ({ locals, params }) => {
	const actor = authorize(locals, 'survey:read');
	const { member } = await api(() => scopedMember(actor, pathId(params.memberId), 'read'));
	return json({ member });
};

export const PUT: RequestHandler = async ({ locals, params, request }) => {
	const actor = authorize(locals, 'member:write');
	const id = pathId(params.memberId);
	const input = await readJson(request, memberSchema);
	return json({ member: await api(() => updateMember(actor, id, input)) });
};
