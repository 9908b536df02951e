/**
 * The demo's signed-off assessments: one a demo asset, saved and approved through the app's own
 * services (src/lib/server/assessments), so that the snapshot, its sha256, the risk annex and the
 * audit events are what the app itself would write. The owner's portfolio, risk chart and report
 * read these on a fresh `npm start`.
 */
import { approve, saveDraft, saveSchema } from '$lib/server/assessments';
import { Asset, Membership, Survey, User } from '$lib/server/db';
import { can, type Actor } from '$lib/server/policy';
import type { DemoAssessmentPlan } from './scenario';

async function actorFor(email: string, action: 'assessment:write' | 'assessment:approve') {
	const user = await User.findOne({ where: { email } });
	const membership = user && (await Membership.findOne({ where: { userId: user.id } }));
	if (!user || !membership) throw new Error(`demo assessment: no demo person ${email}`);
	const actor: Actor = {
		userId: user.id,
		organisationId: membership.organisationId,
		role: membership.role
	};
	// The same permission the routes ask (policy.ts), so the demo never does what its people could not.
	if (!can(actor.role, action)) throw new Error(`demo assessment: ${email} may not ${action}`);
	return actor;
}

/** Save and approve one plan's assessment; returns its id. */
async function signOff(plan: DemoAssessmentPlan): Promise<number> {
	const asset = await Asset.findOne({ where: { name: plan.assetName } });
	const survey =
		asset && (await Survey.findOne({ where: { assetId: asset.id, title: plan.surveyTitle } }));
	if (!asset || !survey) throw new Error(`demo assessment: no survey "${plan.surveyTitle}"`);
	// The body a client would send, through the route's own schema (defaults filled in).
	const body = saveSchema.parse({
		title: plan.title,
		survey: survey.id,
		recommendations: plan.recommendations
	});
	const draft = await saveDraft(await actorFor(plan.savedBy, 'assessment:write'), {
		assetId: asset.id,
		title: body.title,
		surveyId: body.survey,
		split: body.split,
		methods: body.methods,
		recommendations: body.recommendations,
		supersedes: body.supersedes
	});
	await approve(await actorFor(plan.approvedBy, 'assessment:approve'), draft.id);
	return draft.id;
}

/** Every planned assessment, one after another (each is its own transaction in the service). */
export async function signOffDemoAssessments(plans: readonly DemoAssessmentPlan[]) {
	const ids: number[] = [];
	for (const plan of plans) ids.push(await signOff(plan));
	return ids;
}
