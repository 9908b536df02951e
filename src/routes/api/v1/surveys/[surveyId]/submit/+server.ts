import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { authorize } from '$lib/server/web/actor';
import { transitionSurvey } from '$lib/server/intake/surveys';
import { api, idParam } from '$lib/server/web/respond';

/** draft or returned → submitted; its readings are frozen from now on. */
export const POST: RequestHandler = async ({ locals, params }) => {
	const actor = authorize(locals, 'survey:submit');
	const id = idParam(params.surveyId);
	return json({ survey: await api(() => transitionSurvey(actor, id, 'submit')) });
};
