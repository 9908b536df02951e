import { fail, redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { pageActor } from '$lib/server/web/guard';
import { authorize } from '$lib/server/web/actor';
import { can } from '$lib/server/policy';
import { pathId } from '$lib/server/web/params';
import { approve, getAssessment, mayApprove, withSnapshot } from '$lib/server/assessments';
import { visibleAssessment } from '$lib/server/access';
import { loadOr404 } from '$lib/server/web/pages';
import type { AssessmentSnapshot } from '$lib/server/assessments/snapshot';
import {
	assessedSource,
	durabilityFieldGroups,
	loadAnnex,
	readDurabilityForm,
	saveRisk,
	toRiskView
} from '$lib/server/risk';

const exposureClassesOf = (snapshot: AssessmentSnapshot) => [
	...new Set(snapshot.populations.map((p) => p.key.exposureClass))
];

export const load: PageServerLoad = async (event) => {
	const actor = pageActor(event, 'assessment:read');
	const { assessment: row, access } = await loadOr404(() =>
		visibleAssessment(actor, pathId(event.params.id))
	);
	const assessment = await withSnapshot(row);
	const annex = await loadAnnex(row.id);
	return {
		assessment,
		// The risk as the owner will see it: from the annex kept with this assessment.
		risk: toRiskView(await assessedSource(row)),
		canApprove: access === 'own' && can(actor.role, 'assessment:approve'),
		// The preparer of a draft, where a second engineer must approve: told so, not offered it.
		secondApproverNeeded:
			access === 'own' &&
			can(actor.role, 'assessment:approve') &&
			row.state === 'draft' &&
			!(await mayApprove(actor, row)),
		durability: {
			editable: row.state === 'draft' && access === 'own' && can(actor.role, 'assessment:write'),
			groups: durabilityFieldGroups(
				exposureClassesOf(assessment.snapshot),
				annex?.parameters ?? null
			)
		}
	};
};

export const actions = {
	/** Approve the draft (engineers and admins: policy 'assessment:approve'). */
	approve: async ({ locals, params }) => {
		const actor = authorize(locals, 'assessment:approve');
		const approved = await loadOr404(() => approve(actor, pathId(params.id)));
		redirect(303, `/assessments/${approved.id}`);
	},
	/** The engineer's durability parameters for a draft; the projections are computed and kept. */
	durability: async ({ locals, params, request }) => {
		const actor = authorize(locals, 'assessment:write');
		const id = pathId(params.id);
		const row = await loadOr404(() => getAssessment(actor, id));
		const snapshot = (await withSnapshot(row)).snapshot;
		const groups = durabilityFieldGroups(exposureClassesOf(snapshot), null);
		const read = readDurabilityForm(await request.formData(), groups);
		if (!read.ok) return fail(400, { durability: { errors: read.errors, values: read.values } });
		await loadOr404(() => saveRisk(actor, id, read.parameters));
		redirect(303, `/assessments/${id}?saved=durability#durability`);
	}
} satisfies Actions;
