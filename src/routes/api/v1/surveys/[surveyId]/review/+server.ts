import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { authorize } from '$lib/server/web/actor';
import { readJson } from '$lib/server/web/http';
import { reviewSchema } from '$lib/intake/schemas';
import { transitionSurvey } from '$lib/server/intake/surveys';
import { api } from '$lib/server/web/respond';
import { pathId } from '$lib/server/web/params';

/** submitted → approved, or returned with a comment saying what must change. */
export const POST: RequestHandler = async ({ locals, params, request }) => {
	const actor = authorize(locals, 'survey:review');
	const id = pathId(params.surveyId);
	const input = await readJson(request, reviewSchema);
	const step = input.decision === 'approve' ? 'approve' : 'return';
	return json({ survey: await api(() => transitionSurvey(actor, id, step, input.comment)) });
};
