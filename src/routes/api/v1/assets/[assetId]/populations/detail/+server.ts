import { error, json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { toPlainJson } from '$lib/analysis';
import { authorize } from '$lib/server/web/actor';
import { api } from '$lib/server/web/respond';
import {
	calibrationOutcome,
	calibrationSchema,
	customPopulationsOf,
	customSchema,
	groupSchema,
	judgeCustom,
	memberBoxes,
	memberComparison,
	populationMixture,
	meterCheck,
	methodSchema,
	populationDetail,
	requestedSurveyIds,
	scopeSchema,
	surveySelection
} from '$lib/server/populations';
import { scopedAsset } from '$lib/server/access';
import { pathId } from '$lib/server/web/params';
import { queryObject, readQuery } from '$lib/server/web/query';

/**
 * One population with chart data, per-member box figures and comparison, and the meter's
 * verification; with ?calibration=apply also the verdict through the check-hole calibration.
 */
export const GET: RequestHandler = async ({ locals, params, url }) => {
	const actor = authorize(locals, 'population:read');
	const assetId = pathId(params.assetId);
	const query = queryObject(url);
	const scope = readQuery(scopeSchema, query);
	const choice = readQuery(methodSchema, query);
	const { calibration } = readQuery(calibrationSchema, query);
	await api(() => scopedAsset(actor, assetId, 'read'));
	const selection = await api(() => surveySelection(assetId, requestedSurveyIds(scope)));
	const input = { assetId, surveyIds: selection.surveyIds, choice };
	let detail;
	if (query.custom !== undefined) {
		// A population the engineer made, shared by its URL: ?custom=3 (&part=rest for the remainder).
		const picked = readQuery(customSchema, query);
		const [custom] = await api(() => customPopulationsOf(assetId, [picked.custom]));
		[detail] = await judgeCustom({ ...input, charts: true }, custom, picked.part);
	} else {
		detail = await populationDetail(input, readQuery(groupSchema, query));
	}
	if (!detail) error(404, 'No members of this asset match that population.');
	const type = choice.percentile === '6' ? 6 : 7;
	const meter = await meterCheck(detail.group.members.map((m) => m.id));
	return json({
		population: detail.result,
		selection,
		boxes: memberBoxes(detail.group, type),
		members: toPlainJson(memberComparison(detail.group)),
		mixture: toPlainJson(populationMixture(detail.group, detail.result.assessment)),
		meter,
		calibration:
			calibration === 'apply'
				? toPlainJson(calibrationOutcome(detail.result, detail.group, meter, choice))
				: null
	});
};
