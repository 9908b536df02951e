import { redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { authorize, can } from '$lib/server/policy';
import { pageActor } from '$lib/server/guard';
import { parseForm } from '$lib/server/forms';
import { surveySchema } from '$lib/intake/schemas';
import { createSurvey, listSurveys } from '$lib/server/intake/surveys';
import { actOr, loadOr404 } from '$lib/server/intake/pages';
import { idParam } from '$lib/server/intake/respond';
import { scopedAsset } from '$lib/server/scope';

export const load: PageServerLoad = async (event) => {
	const actor = pageActor(event, 'asset:read');
	const assetId = idParam(event.params.assetId);
	const asset = await loadOr404(() => scopedAsset(actor, assetId, 'read'));
	const surveys = await listSurveys(actor, assetId);
	const own = asset.organisationId === actor.organisationId;
	return {
		asset: asset.get({ plain: true }),
		surveys: surveys.map((s) => ({
			id: s.id,
			title: s.title,
			surveyDate: s.surveyDate,
			status: s.status
		})),
		canCreateSurvey: own && can(actor.role, 'survey:create')
	};
};

export const actions = {
	createSurvey: async ({ locals, request, params }) => {
		const actor = authorize(locals, 'survey:create');
		const parsed = await parseForm(request, surveySchema);
		if (!parsed.ok) return parsed.failure;
		const survey = await actOr(parsed.form, () =>
			createSurvey(actor, idParam(params.assetId), parsed.data)
		);
		if (!('id' in survey)) return survey;
		redirect(303, `/surveys/${survey.id}`);
	}
} satisfies Actions;
