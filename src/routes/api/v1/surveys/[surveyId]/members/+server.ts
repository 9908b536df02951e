import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { authorize } from '$lib/server/policy';
import { readJson } from '$lib/server/http';
import { memberSchema } from '$lib/intake/schemas';
import { createMembers, listMembers } from '$lib/server/intake/members';
import { api, idParam } from '$lib/server/intake/respond';

export const GET: RequestHandler = async ({ locals, params }) => {
	const actor = authorize(locals, 'survey:read');
	return json({ members: await api(() => listMembers(actor, idParam(params.surveyId))) });
};

export const POST: RequestHandler = async ({ locals, params, request }) => {
	const actor = authorize(locals, 'member:write');
	const id = idParam(params.surveyId);
	const input = await readJson(request, memberSchema);
	const [member] = await api(() => createMembers(actor, id, [input]));
	return json({ member }, { status: 201 });
};
