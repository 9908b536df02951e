import { redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { formMessage, parseForm } from '$lib/server/web/forms';
import { signUpSchema } from '$lib/server/auth/schemas';
import { createAccountWithOrganisation, EmailTakenError } from '$lib/server/auth/accounts';
import { startSession } from '$lib/server/web/signIn';

export const load: PageServerLoad = async ({ locals }) => {
	if (locals.user) redirect(303, '/dashboard');
};

export const actions = {
	default: async (event) => {
		const parsed = await parseForm(event.request, signUpSchema);
		if (!parsed.ok) return parsed.failure;
		try {
			const user = await createAccountWithOrganisation(parsed.data);
			await startSession(event, user.id);
		} catch (err) {
			if (!(err instanceof EmailTakenError)) throw err;
			// Said plainly: sign-up cannot hide whether an address exists without mailing it,
			// and sign-in throttling still guards the account itself.
			return formMessage(400, parsed.values, err.message, {
				email: 'Sign in instead, or reset the password.'
			});
		}
		redirect(303, '/dashboard');
	}
} satisfies Actions;
