import { error, fail, redirect } from '@sveltejs/kit';
import { z } from 'zod';
import type { Actions, PageServerLoad } from './$types';
import { pageActor } from '$lib/server/web/guard';
import { authorize } from '$lib/server/web/actor';
import { fieldErrors, safeValues } from '$lib/server/web/forms';
import { listApiTokens, TOKEN_MAX_DAYS } from '$lib/server/auth/apiTokens';
import { createTokenSchema, idParamSchema } from '$lib/server/auth/tokenSchemas';
import { createTokenFor, revokeTokenOf } from '$lib/server/auth/tokenActions';
import { clientAddress } from '$lib/server/web/signIn';

export const load: PageServerLoad = async (event) => {
	const actor = pageActor(event, 'token:manage');
	return { tokens: await listApiTokens(actor.userId), maxDays: TOKEN_MAX_DAYS };
};

const revokeSchema = z.object({ id: idParamSchema });

export const actions = {
	// The one answer that is not a redirect: the secret is shown once, on this response only,
	// and a reload must not show it again.
	create: async (event) => {
		const actor = authorize(event.locals, 'token:manage');
		const form = await event.request.formData();
		const parsed = createTokenSchema.safeParse(Object.fromEntries(form));
		if (!parsed.success) {
			return fail(400, { errors: fieldErrors(parsed.error), values: safeValues(form) });
		}
		const { token, secret } = await createTokenFor(actor, parsed.data, clientAddress(event));
		return { created: { name: token.name, secret } };
	},
	revoke: async (event) => {
		const actor = authorize(event.locals, 'token:manage');
		const parsed = revokeSchema.safeParse(Object.fromEntries(await event.request.formData()));
		if (!parsed.success) error(404, 'No such token.');
		const revoked = await revokeTokenOf(actor, parsed.data.id, clientAddress(event));
		if (!revoked) error(404, 'No such token.');
		redirect(303, '/account/tokens');
	}
} satisfies Actions;
