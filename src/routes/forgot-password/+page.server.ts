import { redirect } from '@sveltejs/kit';
import { z } from 'zod';
import type { Actions, PageServerLoad } from './$types';
import { formMessage, parseForm } from '$lib/server/web/forms';
import { emailSchema } from '$lib/server/auth/schemas';
import { requestPasswordResetInBackground } from '$lib/server/auth/passwordReset';
import { resetRequestWait } from '$lib/server/auth/resetThrottle';
import { clientAddress } from '$lib/server/web/request';
import { waitInWords } from '$lib/server/auth/throttleRules';

export const load: PageServerLoad = async ({ url }) => ({ sent: url.searchParams.has('sent') });

export const actions = {
	default: async (event) => {
		const parsed = await parseForm(event.request, z.object({ email: emailSchema }));
		if (!parsed.ok) return parsed.failure;
		const wait = await resetRequestWait(parsed.data.email, clientAddress(event));
		if (wait !== null) {
			event.setHeaders({ 'retry-after': String(wait) });
			const message = `Too many requests for a new password. Try again in ${waitInWords(wait)}.`;
			return formMessage(429, parsed.values, message);
		}
		// The same answer, after the same work, whether or not the address has an account.
		requestPasswordResetInBackground(parsed.data.email);
		redirect(303, '/forgot-password?sent');
	}
} satisfies Actions;
