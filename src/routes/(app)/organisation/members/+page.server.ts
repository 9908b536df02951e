import { error, fail, redirect } from '@sveltejs/kit';
import { z } from 'zod';
import type { Actions, PageServerLoad } from './$types';
import { pageActor } from '$lib/server/web/guard';
import { authorize } from '$lib/server/web/actor';
import { formMessage, parseForm } from '$lib/server/web/forms';
import { inviteSchema, roleSchema } from '$lib/server/auth/schemas';
import { idParamSchema } from '$lib/server/auth/tokenSchemas';
import {
	AlreadyMemberError,
	inviteToOrganisation,
	revokeInvitation
} from '$lib/server/auth/invitations';
import {
	changeRole,
	LastAdminError,
	listMembers,
	removeMember
} from '$lib/server/organisation/members';
import { listOpenInvitations, listUndeliveredMail } from '$lib/server/organisation/overview';
import { secondApproverSetting, setSecondApprover } from '$lib/server/organisation/settings';

export const load: PageServerLoad = async (event) => {
	const actor = pageActor(event, 'organisation:manage');
	return {
		members: await listMembers(actor.organisationId),
		invitations: await listOpenInvitations(actor.organisationId),
		undeliveredMail: await listUndeliveredMail(actor.organisationId),
		selfUserId: actor.userId,
		secondApproverRequired: await secondApproverSetting(actor.organisationId),
		invited: event.url.searchParams.get('invited')
	};
};

const roleChangeSchema = z.object({ id: idParamSchema, role: roleSchema });
const idSchema = z.object({ id: idParamSchema });
const approvalSchema = z.object({ secondApproverRequired: z.enum(['on', 'off']) });

/** An id that is not a record of this organisation is "not found", like any other. */
function parseIdForm<S extends z.ZodType>(form: FormData, schema: S): z.infer<S> {
	const parsed = schema.safeParse(Object.fromEntries(form));
	if (!parsed.success) error(404, 'Not found.');
	return parsed.data;
}

export const actions = {
	/** The organisation's approval rule (admins: 'organisation:manage'). */
	approval: async ({ locals, request }) => {
		const actor = authorize(locals, 'organisation:manage');
		const parsed = approvalSchema.safeParse(Object.fromEntries(await request.formData()));
		if (!parsed.success) {
			return fail(400, { message: 'Choose whether a second engineer must approve.' });
		}
		await setSecondApprover(actor, parsed.data.secondApproverRequired === 'on');
		redirect(303, '/organisation/members');
	},
	invite: async ({ locals, request }) => {
		const actor = authorize(locals, 'organisation:manage');
		const parsed = await parseForm(request, inviteSchema);
		if (!parsed.ok) return parsed.failure;
		try {
			await inviteToOrganisation(actor, parsed.data, locals.user!.displayName);
		} catch (err) {
			if (!(err instanceof AlreadyMemberError)) throw err;
			return formMessage(400, parsed.values, err.message, { email: err.message });
		}
		redirect(303, `/organisation/members?invited=${encodeURIComponent(parsed.data.email)}`);
	},
	role: async ({ locals, request }) => {
		const actor = authorize(locals, 'organisation:manage');
		const { id, role } = parseIdForm(await request.formData(), roleChangeSchema);
		try {
			if (!(await changeRole(actor, id, role))) error(404, 'Not found.');
		} catch (err) {
			if (err instanceof LastAdminError) return fail(400, { message: err.message });
			throw err;
		}
		redirect(303, '/organisation/members');
	},
	remove: async ({ locals, request }) => {
		const actor = authorize(locals, 'organisation:manage');
		const { id } = parseIdForm(await request.formData(), idSchema);
		try {
			if (!(await removeMember(actor, id))) error(404, 'Not found.');
		} catch (err) {
			if (err instanceof LastAdminError) return fail(400, { message: err.message });
			throw err;
		}
		redirect(303, '/organisation/members');
	},
	withdraw: async ({ locals, request }) => {
		const actor = authorize(locals, 'organisation:manage');
		const { id } = parseIdForm(await request.formData(), idSchema);
		if (!(await revokeInvitation(actor, id))) error(404, 'Not found.');
		redirect(303, '/organisation/members');
	}
} satisfies Actions;
