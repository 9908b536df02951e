import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { authorize } from '$lib/server/web/actor';
import { memberView, visibleMember } from '$lib/server/populations';
import { pathId } from '$lib/server/web/params';

/** A member's readings on its grid, its verification holes and the survey meter's check. */
export const GET: RequestHandler = async ({ locals, params }) => {
	const actor = authorize(locals, 'population:read');
	const { member } = await visibleMember(actor, pathId(params.memberId));
	return json(await memberView(member));
};
