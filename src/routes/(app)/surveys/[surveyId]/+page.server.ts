import { fail } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { authorize } from '$lib/server/web/actor';
import { can } from '$lib/server/policy';
import { pageActor } from '$lib/server/web/guard';
import { parseForm } from '$lib/server/web/forms';
import { memberSchema, reviewSchema } from '$lib/intake/schemas';
import { createMembers, listMembers } from '$lib/server/intake/members';
import { parsePastedMembers } from '$lib/server/intake/pastedMembers';
import { transitionSurvey } from '$lib/server/intake/surveys';
import { listImports } from '$lib/server/import/batchActions';
import { IMPORT_LIMITS } from '$lib/server/import/limits';
import { actOr, loadOr404 } from '$lib/server/web/pages';
import { pathId } from '$lib/server/web/params';
import { scopedSurvey } from '$lib/server/access';
import { listAttachments } from '$lib/server/storage/attachments';
import { hasSurveyPlan } from '$lib/server/planning/service';
import { EMPTY_SURVEY_WORDS } from '$lib/intake/frozen';
import { counted } from '$lib/format';
import { frozenReason } from '$lib/server/intake/frozen';

export const load: PageServerLoad = async (event) => {
	const actor = pageActor(event, 'survey:read');
	const surveyId = pathId(event.params.surveyId);
	const { survey, asset } = await loadOr404(() => scopedSurvey(actor, surveyId, 'read'));
	const own = asset.organisationId === actor.organisationId;
	const editable = own && (survey.status === 'draft' || survey.status === 'returned');
	const attachments = await listAttachments(surveyId);
	const members = await listMembers(actor, surveyId);
	// A survey without readings has nothing to review; the service refuses it too.
	const hasReadings = members.some((m) => m.readingCount > 0);
	return {
		survey: survey.get({ plain: true }),
		asset: { id: asset.id, name: asset.name, designCode: asset.designCode },
		members,
		frozen: own ? frozenReason(survey, can(actor.role, 'survey:review')) : null,
		emptyNotice:
			editable && !hasReadings && can(actor.role, 'survey:submit') ? EMPTY_SURVEY_WORDS : null,
		imports: await listImports(actor, surveyId),
		attachments: attachments.map((a) => ({
			id: a.id,
			fileName: a.fileName,
			kind: a.kind,
			contentType: a.contentType,
			byteSize: a.byteSize,
			hasThumbnail: !!a.thumbnailKey,
			caption: a.caption
		})),
		maxImportMb: IMPORT_LIMITS.maxFileBytes / 1024 / 1024,
		can: {
			editSurvey: editable && can(actor.role, 'survey:edit'),
			editMembers: editable && can(actor.role, 'member:write'),
			importReadings: editable && can(actor.role, 'reading:import'),
			upload: editable && can(actor.role, 'attachment:upload'),
			submit: editable && hasReadings && can(actor.role, 'survey:submit'),
			review: own && survey.status === 'submitted' && can(actor.role, 'survey:review'),
			// Planners plan; anyone who reads the survey sees a saved plan and its site sheet.
			plan: (own && can(actor.role, 'survey:plan')) || (await hasSurveyPlan(surveyId))
		}
	};
};

const surveyIdOf = (params: { surveyId: string }) => pathId(params.surveyId);

export const actions = {
	addMember: async ({ locals, request, params }) => {
		const actor = authorize(locals, 'member:write');
		const parsed = await parseForm(request, memberSchema);
		if (!parsed.ok) return parsed.failure;
		const done = await actOr(parsed.form, () =>
			createMembers(actor, surveyIdOf(params), [parsed.data])
		);
		return Array.isArray(done) ? { ok: `Member ${parsed.data.label} added.` } : done;
	},
	pasteMembers: async ({ locals, request, params }) => {
		const actor = authorize(locals, 'member:write');
		const form = await request.formData();
		const table = String(form.get('table') ?? '');
		if (!table.trim())
			return fail(400, {
				errors: { table: 'Paste a table first.' },
				values: {},
				message: undefined
			});
		const done = await actOr(form, async () => {
			const { asset } = await scopedSurvey(actor, surveyIdOf(params), 'write');
			return createMembers(
				actor,
				surveyIdOf(params),
				parsePastedMembers(table, asset.designCode),
				2
			);
		});
		return Array.isArray(done) ? { ok: `${counted(done.length, 'member')} added.` } : done;
	},
	submit: async ({ locals, request, params }) => {
		const actor = authorize(locals, 'survey:submit');
		const form = await request.formData();
		const done = await actOr(form, () => transitionSurvey(actor, surveyIdOf(params), 'submit'));
		return 'id' in done
			? { ok: 'Survey submitted for review; its readings are now frozen.' }
			: done;
	},
	review: async ({ locals, request, params }) => {
		const actor = authorize(locals, 'survey:review');
		const parsed = await parseForm(request, reviewSchema);
		if (!parsed.ok) return parsed.failure;
		const step = parsed.data.decision === 'approve' ? 'approve' : 'return';
		const done = await actOr(parsed.form, () =>
			transitionSurvey(actor, surveyIdOf(params), step, parsed.data.comment)
		);
		return 'id' in done
			? { ok: step === 'approve' ? 'Survey approved.' : 'Survey returned to the surveyor.' }
			: done;
	}
} satisfies Actions;
