import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { authorize } from '$lib/server/web/actor';
import { readJson } from '$lib/server/web/http';
import { createMembers } from '$lib/server/intake/members';
import { parsePastedMembers, pastedTableSchema } from '$lib/server/intake/pastedMembers';
import { scopedSurvey } from '$lib/server/access';
import { api } from '$lib/server/web/respond';
import { pathId } from '$lib/server/web/params';

/** Members from a pasted table, all created or none. */
export const POST: RequestHandler = async ({ locals, params, request }) => {
	const actor = authorize(locals, 'member:write');
	const id = pathId(params.surveyId);
	const { table } = await readJson(request, pastedTableSchema);
	const members = await api(async () => {
		const { asset } = await scopedSurvey(actor, id, 'write');
		return createMembers(actor, id, parsePastedMembers(table, asset.designCode), 2);
	});
	return json({ created: members.length }, { status: 201 });
};
