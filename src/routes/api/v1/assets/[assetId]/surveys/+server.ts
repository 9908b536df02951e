import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { authorize } from '$lib/server/web/actor';
import { scopedAsset } from '$lib/server/access';
import { surveysOf } from '$lib/server/api/ownRecords';
import { readJson } from '$lib/server/web/http';
import { surveySchema } from '$lib/intake/schemas';
import { createSurvey } from '$lib/server/intake/surveys';
import { api } from '$lib/server/web/respond';
import { pathId } from '$lib/server/web/params';

export const GET: RequestHandler = async ({ locals, params }) => {
	const actor = authorize(locals, 'survey:read');
	const assetId = pathId(params.assetId);
	const asset = await api(() => scopedAsset(actor, assetId, 'read'));
	return json({ surveys: await surveysOf(asset.id) });
};

export const POST: RequestHandler = async ({ locals, params, request }) => {
	const actor = authorize(locals, 'survey:create');
	const assetId = pathId(params.assetId);
	const input = await readJson(request, surveySchema);
	return json({ survey: await api(() => createSurvey(actor, assetId, input)) }, { status: 201 });
};
