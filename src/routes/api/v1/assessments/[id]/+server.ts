import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { authorize } from '$lib/server/web/actor';
import { pathId } from '$lib/server/web/params';
import { getAssessment, withSnapshot } from '$lib/server/assessments';
import { api } from '$lib/server/web/respond';

/** One assessment with its snapshot exactly as stored. */
export const GET: RequestHandler = async ({ locals, params }) => {
	const actor = authorize(locals, 'assessment:read');
	const row = await api(() => getAssessment(actor, pathId(params.id)));
	return json({ assessment: await withSnapshot(row) });
};
