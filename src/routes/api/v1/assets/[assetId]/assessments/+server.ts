import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { authorize } from '$lib/server/web/actor';
import { pathId } from '$lib/server/web/params';
import { history, saveDraft, saveSchema, summarise } from '$lib/server/assessments';
import { readJson } from '$lib/server/web/http';
import { api } from '$lib/server/web/respond';

/** The asset's assessments, newest first (drafts only for those who may write them). */
export const GET: RequestHandler = async ({ locals, params }) => {
	const actor = authorize(locals, 'assessment:read');
	const rows = await api(() => history(actor, pathId(params.assetId)));
	return json({ assessments: await summarise(rows) });
};

/** Compute the populations now and save them as a draft assessment (optionally superseding). */
export const POST: RequestHandler = async ({ locals, params, request }) => {
	const actor = authorize(locals, 'assessment:write');
	const assetId = pathId(params.assetId);
	const body = await readJson(request, saveSchema);
	const saved = await api(() =>
		saveDraft(actor, {
			assetId,
			title: body.title,
			surveyId: body.survey,
			surveyIds: body.surveys,
			split: body.split,
			customIds: body.custom,
			methods: body.methods,
			calibration: body.calibration,
			recommendations: body.recommendations,
			supersedes: body.supersedes
		})
	);
	const [summary] = await summarise([saved]);
	return json({ assessment: summary }, { status: 201 });
};
