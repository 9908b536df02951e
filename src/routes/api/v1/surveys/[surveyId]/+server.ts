import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { authorize } from '$lib/server/web/actor';
import { readJson } from '$lib/server/web/http';
import { surveySchema } from '$lib/intake/schemas';
import { updateSurvey } from '$lib/server/intake/surveys';
import { scopedSurvey } from '$lib/server/access';
import { api } from '$lib/server/web/respond';
import { pathId } from '$lib/server/web/params';

export const GET: RequestHandler = async ({ locals, params }) => {
	const actor = authorize(locals, 'survey:read');
	const { survey } = await api(() => scopedSurvey(actor, pathId(params.surveyId), 'read'));
	return json({ survey });
};

export const PUT: RequestHandler = async ({ locals, params, request }) => {
	const actor = authorize(locals, 'survey:edit');
	const id = pathId(params.surveyId);
	const input = await readJson(request, surveySchema);
	return json({ survey: await api(() => updateSurvey(actor, id, input)) });
};
