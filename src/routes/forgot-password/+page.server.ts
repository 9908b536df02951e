import { redirect } from '@sveltejs/kit';
import { z } from 'zod';
import type { Actions, PageServerLoad } from './$types';
import { parseForm } from '$lib/server/forms';
import { emailSchema } from '$lib/server/auth/schemas';
import { requestPasswordReset } from '$lib/server/auth/password-reset';

export const load: PageServerLoad = async ({ url }) => ({ sent: url.searchParams.has('sent') });

export const actions = {
	default: async ({ request }) => {
		const parsed = await parseForm(request, z.object({ email: emailSchema }));
		if (!parsed.ok) return parsed.failure;
		await requestPasswordReset(parsed.data.email);
		// The same answer whether or not the address has an account.
		redirect(303, '/forgot-password?sent');
	}
} satisfies Actions;
