import { fail, redirect, type ActionFailure } from '@sveltejs/kit';
import { z } from 'zod';
import type { Actions, PageServerLoad } from './$types';
import { pageActor } from '$lib/server/web/guard';
import { authorize } from '$lib/server/web/actor';
import { can } from '$lib/server/policy';
import {
	customPopulationsOf,
	methodSchema,
	readingCountOf,
	requestedSurveyIds,
	scopeSchema,
	surveySelection
} from '$lib/server/populations';
import { visibleAsset } from '$lib/server/access';
import { loadOr404 } from '$lib/server/web/pages';
import { pathId } from '$lib/server/web/params';
import { history, saveDraft, saveSchema, summarise } from '$lib/server/assessments';
import { InputError } from '$lib/server/domainErrors';

export const load: PageServerLoad = async (event) => {
	const actor = pageActor(event, 'assessment:read');
	const { asset, access } = await loadOr404(() =>
		visibleAsset(actor, pathId(event.params.assetId))
	);
	const rows = await loadOr404(() => history(actor, asset.id));
	const own = access === 'own';
	// What a save would keep: the population page's selection and methods, carried in ?query=.
	const query = Object.fromEntries(new URLSearchParams(event.url.searchParams.get('query') ?? ''));
	const scope = scopeSchema.safeParse(query);
	const methods = methodSchema.safeParse(query);
	const selection = await loadOr404(() =>
		surveySelection(asset.id, scope.success ? requestedSurveyIds(scope.data) : null)
	);
	return {
		asset: { id: asset.id, name: asset.name },
		preview: {
			selection,
			readingCount: await readingCountOf(asset.id, selection.surveyIds),
			methods: methods.success ? methods.data : methodSchema.parse({}),
			split: scope.success ? scope.data.split : 'none',
			queryProblem: !scope.success
				? scope.error.issues[0].message
				: !methods.success
					? methods.error.issues[0].message
					: null
		},
		/** The asset's custom populations, to choose which the assessment carries. */
		custom: (await customPopulationsOf(asset.id)).map((c) => ({
			id: c.id,
			name: c.name,
			memberCount: c.memberIds.length,
			splitFromLabel: c.splitFromLabel
		})),
		assessments: await summarise(rows),
		canSave: own && can(actor.role, 'assessment:write'),
		canApprove: own && can(actor.role, 'assessment:approve')
	};
};

const formSchema = z.object({
	title: saveSchema.shape.title,
	recommendations: z.string().trim().max(20_000).optional(),
	supersedesId: z.coerce.number().int().positive().optional(),
	reason: z.string().trim().optional(),
	query: z.string().max(2000).default(''),
	custom: z.array(z.coerce.number().int().positive()).max(500).default([]),
	/** The box "also judge each population through the check holes", ticked or not. */
	calibration: z.enum(['apply'], 'The calibration box sends apply or nothing.').optional()
});

type FormErrors = Partial<Record<'title' | 'reason' | 'custom', string>>;
const refuse = (
	values: { title: string; reason: string },
	errors: FormErrors
): ActionFailure<{ values: { title: string; reason: string }; errors: FormErrors }> =>
	fail(400, { values, errors });

export const actions = {
	/** Save the populations as they are now (with the methods in the page URL) as a draft. */
	save: async ({ locals, params, request }) => {
		const actor = authorize(locals, 'assessment:write');
		const form = await request.formData();
		const fields = Object.fromEntries(form) as Record<string, string>;
		const values = { title: fields.title ?? '', reason: fields.reason ?? '' };
		// The ticked custom populations: none ticked is a choice of none.
		const parsed = formSchema.safeParse({ ...fields, custom: form.getAll('custom') });
		if (!parsed.success) {
			const issue = parsed.error.issues[0];
			const errors: FormErrors =
				issue.path[0] === 'reason'
					? { reason: issue.message }
					: issue.path[0] === 'custom'
						? { custom: issue.message }
						: { title: issue.message };
			return refuse(values, errors);
		}
		const query = Object.fromEntries(new URLSearchParams(parsed.data.query));
		const methods = methodSchema.safeParse(query);
		if (!methods.success) return refuse(values, { title: methods.error.issues[0].message });
		const supersedes = parsed.data.supersedesId
			? saveSchema.shape.supersedes.safeParse({
					id: parsed.data.supersedesId,
					reason: parsed.data.reason ?? ''
				})
			: null;
		if (supersedes && !supersedes.success) {
			return refuse(values, { reason: supersedes.error.issues[0].message });
		}
		const scope = scopeSchema.safeParse(query);
		if (!scope.success) return refuse(values, { title: scope.error.issues[0].message });
		if (scope.data.surveys?.length === 0) {
			return refuse(values, {
				title: 'No survey is included: go back and tick at least one survey.'
			});
		}
		// A refusal of the input (a custom population deleted since the page was drawn, no survey
		// chosen) is said beside the form; anything else is the page's error.
		const saved = await loadOr404(() =>
			saveDraft(actor, {
				assetId: pathId(params.assetId),
				title: parsed.data.title,
				surveyId: null,
				surveyIds: requestedSurveyIds(scope.data),
				split: scope.data.split,
				customIds: parsed.data.custom,
				methods: methods.data,
				calibration: parsed.data.calibration ?? 'none',
				recommendations: parsed.data.recommendations || null,
				supersedes: supersedes?.data ?? null
			}).catch((err: unknown) => {
				if (err instanceof InputError) return err;
				throw err;
			})
		);
		if (saved instanceof InputError) {
			const field = Object.keys(saved.fieldErrors)[0] ?? 'custom';
			return refuse(values, { [field]: saved.message });
		}
		redirect(303, `/assessments/${saved.id}`);
	}
} satisfies Actions;
