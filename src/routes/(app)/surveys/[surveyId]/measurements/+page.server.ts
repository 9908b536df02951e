import { fail } from '@sveltejs/kit';
import { z } from 'zod';
import type { Actions, PageServerLoad } from './$types';
import { authorize } from '$lib/server/web/actor';
import { can } from '$lib/server/policy';
import { pageActor } from '$lib/server/web/guard';
import { fieldErrors, safeValues } from '$lib/server/web/forms';
import {
	carbonationDepths,
	carbonationTestSchema,
	chlorideProfileSchema,
	concreteAgeYears
} from '$lib/intake/measurements';
import {
	carbonationTestsOfSurvey,
	createCarbonationTest,
	deleteCarbonationTest
} from '$lib/server/intake/carbonation';
import {
	chlorideProfilesOfSurvey,
	createChlorideProfile,
	deleteChlorideProfile
} from '$lib/server/intake/chloride';
import { IMPORT_LIMITS } from '$lib/server/import/limits';
import { listMembers } from '$lib/server/intake/members';
import { actOr, loadOr404 } from '$lib/server/web/pages';
import { frozenReason } from '$lib/server/intake/frozen';
import { pathId } from '$lib/server/web/params';
import { scopedSurvey } from '$lib/server/access';

export const load: PageServerLoad = async (event) => {
	const actor = pageActor(event, 'survey:read');
	const surveyId = pathId(event.params.surveyId);
	const { survey, asset } = await loadOr404(() => scopedSurvey(actor, surveyId, 'read'));
	const own = asset.organisationId === actor.organisationId;
	const [members, tests, profiles] = await Promise.all([
		listMembers(actor, surveyId),
		carbonationTestsOfSurvey(actor, surveyId),
		chlorideProfilesOfSurvey(actor, surveyId)
	]);
	const { yearOfConstruction } = asset;
	const age = (testedOn: string) =>
		yearOfConstruction === null ? null : concreteAgeYears(yearOfConstruction, testedOn);
	return {
		survey: { id: survey.id, title: survey.title, status: survey.status },
		asset: { id: asset.id, name: asset.name, yearOfConstruction: asset.yearOfConstruction },
		members: members.map((m) => ({
			id: m.id,
			label: m.label,
			memberType: m.memberType,
			exposureClass: m.exposureClass
		})),
		carbonationTests: tests.map((t) => ({
			id: t.id,
			memberId: t.memberId,
			label: t.label,
			xMm: t.xMm,
			yMm: t.yMm,
			testedOn: t.testedOn,
			method: t.method,
			depthsMm: t.depthsMm,
			ageYears: age(t.testedOn),
			depths: carbonationDepths(t)
		})),
		chlorideProfiles: profiles.map((p) => ({ ...p, ageYears: age(p.testedOn) })),
		frozen: frozenReason(survey),
		maxImportMb: IMPORT_LIMITS.maxFileBytes / 1024 / 1024,
		can: {
			add: own && !frozenReason(survey) && can(actor.role, 'measurement:write'),
			import:
				own &&
				!frozenReason(survey) &&
				can(actor.role, 'measurement:write') &&
				can(actor.role, 'reading:import')
		}
	};
};

const memberField = z.object({
	memberId: z.coerce.number({ error: 'Choose the member.' }).int().positive('Choose the member.')
});
const idField = z.object({ id: z.coerce.number().int().positive() });

/** Reads one of the two add forms: the member, then the measurement's own schema. */
async function readAddForm<S extends z.ZodType>(request: Request, schema: S, which: string) {
	const form = await request.formData();
	const raw = Object.fromEntries(form);
	const member = memberField.safeParse(raw);
	const parsed = schema.safeParse(raw);
	if (member.success && parsed.success) {
		return { ok: true as const, form, memberId: member.data.memberId, data: parsed.data };
	}
	const errors = {
		...(member.success ? {} : fieldErrors(member.error)),
		...(parsed.success ? {} : fieldErrors(parsed.error))
	};
	return {
		ok: false as const,
		failure: fail(400, { errors, values: safeValues(form), message: undefined, which })
	};
}

/** The record a delete button names; a missing or bad id is a 400, not a 500. */
async function readId(request: Request) {
	const form = await request.formData();
	const parsed = idField.safeParse(Object.fromEntries(form));
	return { form, id: parsed.success ? parsed.data.id : null };
}

const noRecord = (form: FormData) =>
	fail(400, { errors: {}, values: safeValues(form), message: 'Say which record to remove.' });

export const actions = {
	addCarbonation: async ({ locals, request }) => {
		const actor = authorize(locals, 'measurement:write');
		const read = await readAddForm(request, carbonationTestSchema, 'carbonation');
		if (!read.ok) return read.failure;
		const done = await actOr(read.form, () =>
			createCarbonationTest(actor, read.memberId, read.data)
		);
		return 'id' in done ? { ok: `Carbonation test ${read.data.label} recorded.` } : done;
	},
	addChloride: async ({ locals, request }) => {
		const actor = authorize(locals, 'measurement:write');
		const read = await readAddForm(request, chlorideProfileSchema, 'chloride');
		if (!read.ok) return read.failure;
		const done = await actOr(read.form, () =>
			createChlorideProfile(actor, read.memberId, read.data)
		);
		return 'id' in done ? { ok: `Chloride profile ${read.data.label} recorded.` } : done;
	},
	deleteCarbonation: async ({ locals, request }) => {
		const actor = authorize(locals, 'measurement:write');
		const { form, id } = await readId(request);
		if (id === null) return noRecord(form);
		const done = await actOr(form, () => deleteCarbonationTest(actor, id));
		return 'id' in done ? { ok: 'Carbonation test removed.' } : done;
	},
	deleteChloride: async ({ locals, request }) => {
		const actor = authorize(locals, 'measurement:write');
		const { form, id } = await readId(request);
		if (id === null) return noRecord(form);
		const done = await actOr(form, () => deleteChlorideProfile(actor, id));
		return 'id' in done ? { ok: 'Chloride profile removed.' } : done;
	}
} satisfies Actions;
