import { fail } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { can } from '$lib/server/policy';
import { authorize } from '$lib/server/web/actor';
import { pageActor } from '$lib/server/web/guard';
import { surveyPlanSchema, type PlannedPopulationInput } from '$lib/intake/plan';
import { actOr, loadOr404 } from '$lib/server/web/pages';
import { pathId } from '$lib/server/web/params';
import { scopedSurvey } from '$lib/server/access';
import { proposedPopulations, saveSurveyPlan, surveyPlanOf } from '$lib/server/planning/service';

export const load: PageServerLoad = async (event) => {
	const actor = pageActor(event, 'survey:read');
	const surveyId = pathId(event.params.surveyId);
	const { survey, asset } = await loadOr404(() => scopedSurvey(actor, surveyId, 'read'));
	const plan = await surveyPlanOf(actor, surveyId);
	const own = asset.organisationId === actor.organisationId;
	const editable = own && (survey.status === 'draft' || survey.status === 'returned');
	return {
		survey: { id: survey.id, title: survey.title, status: survey.status },
		asset: { id: asset.id, name: asset.name },
		plan,
		proposed: plan ? plan.populations : await proposedPopulations(actor, surveyId),
		canPlan: editable && can(actor.role, 'survey:plan')
	};
};

const POPULATION_FIELDS = [
	'memberType',
	'exposureClass',
	'memberCount',
	'sdMm',
	'cMinMm',
	'cNomMm',
	'deltaPlusMm'
] as const;
const SETTING_FIELDS = [
	'ruleSet',
	'method',
	'model',
	'fractileP',
	'confidence',
	'minSampleSize',
	'marginMm',
	'p0',
	'p1',
	'alpha',
	'beta',
	'seed',
	'replicates'
] as const;

/** The form's rows: each population field is posted once a row; a row with no exposure is unused. */
function planFromForm(form: FormData) {
	const columns = Object.fromEntries(POPULATION_FIELDS.map((f) => [f, form.getAll(f).map(String)]));
	const populations: Record<string, string>[] = [];
	columns.memberType.forEach((_, i) => {
		const row = Object.fromEntries(POPULATION_FIELDS.map((f) => [f, columns[f][i] ?? '']));
		if (row.exposureClass.trim() !== '') populations.push(row);
	});
	const settings = Object.fromEntries(
		SETTING_FIELDS.filter((f) => form.get(f) !== null && form.get(f) !== '').map((f) => [
			f,
			String(form.get(f))
		])
	);
	return { settings, populations };
}

export const actions = {
	save: async ({ locals, request, params }) => {
		const actor = authorize(locals, 'survey:plan');
		const surveyId = pathId(params.surveyId);
		const form = await request.formData();
		const raw = planFromForm(form);
		const parsed = surveyPlanSchema.safeParse(raw);
		if (!parsed.success) {
			const issue = parsed.error.issues[0];
			const where =
				issue.path[0] === 'populations' && typeof issue.path[1] === 'number'
					? `Population row ${issue.path[1] + 1}, ${String(issue.path[2] ?? '')}: `
					: issue.path.length > 1
						? `${String(issue.path[1])}: `
						: '';
			return fail(400, {
				message: `${where}${issue.message}`,
				populations: raw.populations as unknown as PlannedPopulationInput[]
			});
		}
		const done = await actOr(form, () => saveSurveyPlan(actor, surveyId, parsed.data));
		return typeof done === 'number' ? { ok: 'Plan saved.' } : done;
	}
} satisfies Actions;
