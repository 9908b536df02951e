import { redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { formMessage, parseForm } from '$lib/server/web/forms';
import { acceptInvitationSchema } from '$lib/server/auth/schemas';
import { acceptInvitation, findOpenInvitation } from '$lib/server/auth/invitations';
import { startSession } from '$lib/server/web/signIn';
import { requireActor } from '$lib/server/web/actor';

const GONE = 'This invitation has expired, was withdrawn or was already used.';

export const load: PageServerLoad = async ({ params, locals, url }) => {
	const open = await findOpenInvitation(params.token);
	return {
		invitation: open && {
			organisationName: open.organisationName,
			email: open.invitation.email,
			role: open.invitation.role,
			hasAccount: open.hasAccount
		},
		signedInAs: locals.user?.email ?? null,
		signInHref: `/sign-in?next=${encodeURIComponent(url.pathname)}`
	};
};

export const actions = {
	/** A newcomer: name and password, then signed in. */
	create: async (event) => {
		const parsed = await parseForm(event.request, acceptInvitationSchema);
		if (!parsed.ok) return parsed.failure;
		const user = await acceptInvitation(event.params.token, { newAccount: parsed.data });
		if (!user) return formMessage(400, parsed.values, GONE);
		await startSession(event, user.id);
		redirect(303, '/dashboard');
	},
	/** Someone who already has an account, signed in with the invited address. */
	join: async ({ locals, params, request }) => {
		const actor = requireActor(locals);
		const form = await request.formData();
		const user = await acceptInvitation(params.token, { userId: actor.userId });
		if (!user) return formMessage(400, form, GONE);
		redirect(303, '/dashboard');
	}
} satisfies Actions;
