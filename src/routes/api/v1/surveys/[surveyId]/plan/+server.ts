import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { authorize } from '$lib/server/web/actor';
import { apiError, readJson } from '$lib/server/web/http';
import { surveyPlanSchema } from '$lib/intake/plan';
import { deleteSurveyPlan, saveSurveyPlan, surveyPlanOf } from '$lib/server/planning/service';
import { api } from '$lib/server/web/respond';
import { pathId } from '$lib/server/web/params';

export const GET: RequestHandler = async ({ locals, params }) => {
	const actor = authorize(locals, 'survey:read');
	const id = pathId(params.surveyId);
	const plan = await api(() => surveyPlanOf(actor, id));
	if (!plan) apiError(404, 'not_found', 'The survey has no plan yet.');
	return json({ plan });
};

/** Saves the plan (a new one replaces the old), computed by the engine; answers it as saved. */
export const PUT: RequestHandler = async ({ locals, params, request }) => {
	const actor = authorize(locals, 'survey:plan');
	const id = pathId(params.surveyId);
	const input = await readJson(request, surveyPlanSchema);
	await api(() => saveSurveyPlan(actor, id, input));
	return json({ plan: await api(() => surveyPlanOf(actor, id)) });
};

export const DELETE: RequestHandler = async ({ locals, params }) => {
	const actor = authorize(locals, 'survey:plan');
	const id = pathId(params.surveyId);
	return json({ deleted: await api(() => deleteSurveyPlan(actor, id)) });
};
