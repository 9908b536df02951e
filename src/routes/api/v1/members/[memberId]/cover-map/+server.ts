import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { authorize } from '$lib/server/web/actor';
import { memberView } from '$lib/server/populations';
import { scopedMember } from '$lib/server/access';
import { api } from '$lib/server/web/respond';
import { pathId } from '$lib/server/web/params';

/** A member's readings on its grid, its verification holes and the survey meter's check. */
export const GET: RequestHandler = async ({ locals, params }) => {
	const actor = authorize(locals, 'population:read');
	const { member } = await api(() => scopedMember(actor, pathId(params.memberId), 'read'));
	return json(await memberView(member));
};
