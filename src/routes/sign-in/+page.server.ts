import { redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { parseForm, formMessage } from '$lib/server/web/forms';
import { signInSchema } from '$lib/server/auth/schemas';
import { attemptSignIn, clientAddress, startSession } from '$lib/server/web/signIn';
import { safeNext } from '$lib/server/web/guard';

export const load: PageServerLoad = async ({ locals, url }) => {
	if (locals.user) redirect(303, safeNext(url.searchParams.get('next')));
	return {
		next: safeNext(url.searchParams.get('next')),
		passwordReset: url.searchParams.get('reset') === 'done'
	};
};

export const actions = {
	default: async (event) => {
		const parsed = await parseForm(event.request, signInSchema);
		if (!parsed.ok) return parsed.failure;
		const { email, password } = parsed.data;
		const outcome = await attemptSignIn(email, password, clientAddress(event));
		if (!outcome.ok && outcome.retryAfterSeconds) {
			event.setHeaders({ 'retry-after': String(outcome.retryAfterSeconds) });
			return formMessage(429, parsed.values, outcome.message);
		}
		if (!outcome.ok) return formMessage(400, parsed.values, outcome.message);
		await startSession(event, outcome.user.id);
		redirect(303, safeNext(event.url.searchParams.get('next')));
	}
} satisfies Actions;
