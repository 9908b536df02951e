import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { authorize } from '$lib/server/web/actor';
import {
	customOverview,
	methodSchema,
	populationOverview,
	requestedSurveyIds,
	scopeSchema,
	surveySelection
} from '$lib/server/populations';
import { scopedAsset } from '$lib/server/access';
import { api } from '$lib/server/web/respond';
import { pathId } from '$lib/server/web/params';
import { queryObject, readQuery } from '$lib/server/web/query';

/** The population overview of an asset or one of its surveys: every group, judged by the engine. */
export const GET: RequestHandler = async ({ locals, params, url }) => {
	const actor = authorize(locals, 'population:read');
	const assetId = pathId(params.assetId);
	const query = queryObject(url);
	const scope = readQuery(scopeSchema, query);
	const choice = readQuery(methodSchema, query);
	await api(() => scopedAsset(actor, assetId, 'read'));
	const selection = await api(() => surveySelection(assetId, requestedSurveyIds(scope)));
	const overview = await populationOverview({
		assetId,
		surveyIds: selection.surveyIds,
		split: scope.split,
		choice
	});
	const custom = await customOverview({ assetId, surveyIds: selection.surveyIds, choice });
	return json({ ...overview, selection, custom });
};
