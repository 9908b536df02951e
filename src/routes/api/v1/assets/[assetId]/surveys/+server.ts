import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { authorize } from '$lib/server/policy';
import { readJson } from '$lib/server/http';
import { surveySchema } from '$lib/intake/schemas';
import { createSurvey, listSurveys } from '$lib/server/intake/surveys';
import { api, idParam } from '$lib/server/intake/respond';

export const GET: RequestHandler = async ({ locals, params }) => {
	const actor = authorize(locals, 'survey:read');
	return json({ surveys: await api(() => listSurveys(actor, idParam(params.assetId))) });
};

export const POST: RequestHandler = async ({ locals, params, request }) => {
	const actor = authorize(locals, 'survey:create');
	const assetId = idParam(params.assetId);
	const input = await readJson(request, surveySchema);
	return json({ survey: await api(() => createSurvey(actor, assetId, input)) }, { status: 201 });
};
