import type { Actions, PageServerLoad } from './$types';
import { pageActor } from '$lib/server/web/guard';
import { can } from '$lib/server/policy';
import { surveySchema } from '$lib/intake/schemas';
import { formValuesOf } from '$lib/intake/formValues';
import { updateSurvey } from '$lib/server/intake/surveys';
import { frozenReason } from '$lib/server/intake/frozen';
import { loadOr404, savingAction } from '$lib/server/web/pages';
import { pathId } from '$lib/server/web/params';
import { withSavedNotice } from '$lib/intake/savedNotice';
import { scopedSurvey } from '$lib/server/access';

/** A survey's details (title, date, meter), editable while it is a draft or returned. */
export const load: PageServerLoad = async (event) => {
	const actor = pageActor(event, 'survey:edit');
	const surveyId = pathId(event.params.surveyId);
	const { survey } = await loadOr404(() => scopedSurvey(actor, surveyId, 'write'));
	return {
		survey: { id: survey.id, title: survey.title },
		values: formValuesOf(survey.get({ plain: true }), surveySchema),
		frozen: frozenReason(survey, can(actor.role, 'survey:review'))
	};
};

export const actions = {
	save: savingAction(
		'survey:edit',
		surveySchema,
		(actor, input, params: { surveyId: string }) =>
			updateSurvey(actor, pathId(params.surveyId), input),
		(survey) => withSavedNotice(`/surveys/${survey.id}`, 'survey')
	)
} satisfies Actions;
