import type { Actions, PageServerLoad } from './$types';
import { can } from '$lib/server/policy';
import { pageActor } from '$lib/server/web/guard';
import { surveySchema } from '$lib/intake/schemas';
import { createSurvey, listSurveys } from '$lib/server/intake/surveys';
import { loadOr404, savingAction } from '$lib/server/web/pages';
import { pathId } from '$lib/server/web/params';
import { scopedAsset } from '$lib/server/access';

export const load: PageServerLoad = async (event) => {
	const actor = pageActor(event, 'asset:read');
	const assetId = pathId(event.params.assetId);
	const asset = await loadOr404(() => scopedAsset(actor, assetId, 'read'));
	// Owners read an asset's assessments and reports, not its surveys (docs/roles.md).
	const canReadSurveys = can(actor.role, 'survey:read');
	const surveys = canReadSurveys ? await listSurveys(actor, assetId) : [];
	const own = asset.organisationId === actor.organisationId;
	return {
		asset: asset.get({ plain: true }),
		surveys: surveys.map((s) => ({
			id: s.id,
			title: s.title,
			surveyDate: s.surveyDate,
			status: s.status
		})),
		canReadSurveys,
		canCreateSurvey: own && can(actor.role, 'survey:create'),
		canEdit: own && can(actor.role, 'asset:write'),
		// Where the asset leads on, each only for a role the policy lets follow it.
		onward: {
			populations: can(actor.role, 'population:read'),
			assessments: can(actor.role, 'assessment:read'),
			ownerView: can(actor.role, 'report:read')
		}
	};
};

export const actions = {
	createSurvey: savingAction(
		'survey:create',
		surveySchema,
		(actor, input, params: { assetId: string }) =>
			createSurvey(actor, pathId(params.assetId), input),
		(survey) => `/surveys/${survey.id}`
	)
} satisfies Actions;
