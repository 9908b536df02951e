import { redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { formMessage, parseForm } from '$lib/server/web/forms';
import { resetPasswordSchema } from '$lib/server/auth/schemas';
import { completePasswordReset, findUsableReset } from '$lib/server/auth/passwordReset';

export const load: PageServerLoad = async ({ params }) => ({
	usable: (await findUsableReset(params.token)) !== null
});

export const actions = {
	default: async ({ params, request }) => {
		const parsed = await parseForm(request, resetPasswordSchema);
		if (!parsed.ok) return parsed.failure;
		if (!(await completePasswordReset(params.token, parsed.data.password))) {
			return formMessage(400, parsed.values, 'This link has expired or was already used.');
		}
		redirect(303, '/sign-in?reset=done');
	}
} satisfies Actions;
