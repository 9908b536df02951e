import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { authorize } from '$lib/server/web/actor';
import { transitionSurvey } from '$lib/server/intake/surveys';
import { api } from '$lib/server/web/respond';
import { pathId } from '$lib/server/web/params';

/** draft or returned → submitted; its readings are frozen from now on. */
export const POST: RequestHandler = async ({ locals, params }) => {
	const actor = authorize(locals, 'survey:submit');
	const id = pathId(params.surveyId);
	return json({ survey: await api(() => transitionSurvey(actor, id, 'submit')) });
};
