import { redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { pageActor } from '$lib/server/guard';
import { authorize, can } from '$lib/server/policy';
import { pathId, visibleAsset } from '$lib/server/populations';
import { approve, getAssessment, withSnapshot } from '$lib/server/assessments';

export const load: PageServerLoad = async (event) => {
	const actor = pageActor(event, 'assessment:read');
	const row = await getAssessment(actor, pathId(event.params.id));
	const { access } = await visibleAsset(actor, row.assetId);
	return {
		assessment: await withSnapshot(row),
		canApprove: access === 'own' && can(actor.role, 'assessment:approve')
	};
};

export const actions = {
	/** Approve the draft (engineers and admins: policy 'assessment:approve'). */
	approve: async ({ locals, params }) => {
		const actor = authorize(locals, 'assessment:approve');
		const approved = await approve(actor, pathId(params.id));
		redirect(303, `/assessments/${approved.id}`);
	}
} satisfies Actions;
