import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { authorize } from '$lib/server/web/actor';
import { scopedSurvey } from '$lib/server/access';
import { membersOf } from '$lib/server/api/ownRecords';
import { readJson } from '$lib/server/web/http';
import { memberSchema } from '$lib/intake/schemas';
import { createMembers } from '$lib/server/intake/members';
import { api } from '$lib/server/web/respond';
import { pathId } from '$lib/server/web/params';

export const GET: RequestHandler = async ({ locals, params }) => {
	const actor = authorize(locals, 'survey:read');
	const { survey } = await api(() => scopedSurvey(actor, pathId(params.surveyId), 'read'));
	return json({ members: await membersOf(survey.id) });
};

export const POST: RequestHandler = async ({ locals, params, request }) => {
	const actor = authorize(locals, 'member:write');
	const id = pathId(params.surveyId);
	const input = await readJson(request, memberSchema);
	const [member] = await api(() => createMembers(actor, id, [input]));
	return json({ member }, { status: 201 });
};
