import { redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { pageActor } from '$lib/server/web/guard';
import { authorize } from '$lib/server/web/actor';
import { formMessage, parseForm } from '$lib/server/web/forms';
import { changePasswordSchema } from '$lib/server/auth/schemas';
import { changePassword } from '$lib/server/auth/passwordChange';

export const load: PageServerLoad = async (event) => {
	pageActor(event, 'account:manage');
	return { changed: event.url.searchParams.has('changed') };
};

export const actions = {
	password: async ({ locals, request }) => {
		const actor = authorize(locals, 'account:manage');
		const parsed = await parseForm(request, changePasswordSchema);
		if (!parsed.ok) return parsed.failure;
		const changed = await changePassword({
			userId: actor.userId,
			currentSessionId: locals.session?.id ?? null,
			...parsed.data
		});
		if (!changed) {
			return formMessage(400, parsed.values, 'The current password is not right.', {
				currentPassword: 'This is not your current password.'
			});
		}
		redirect(303, '/account?changed');
	}
} satisfies Actions;
