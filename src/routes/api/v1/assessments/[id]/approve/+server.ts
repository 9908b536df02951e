import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { authorize } from '$lib/server/web/actor';
import { pathId } from '$lib/server/web/params';
import { approve, summarise } from '$lib/server/assessments';
import { api } from '$lib/server/web/respond';

/** Approve a draft assessment: engineers and admins only (policy 'assessment:approve'). */
export const POST: RequestHandler = async ({ locals, params }) => {
	const actor = authorize(locals, 'assessment:approve');
	const approved = await api(() => approve(actor, pathId(params.id)));
	const [summary] = await summarise([approved]);
	return json({ assessment: summary });
};
