import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { authorize } from '$lib/server/web/actor';
import { readJson } from '$lib/server/web/http';
import { listApiTokens } from '$lib/server/auth/apiTokens';
import { createTokenSchema } from '$lib/server/auth/tokenSchemas';
import { createTokenFor } from '$lib/server/auth/tokenActions';
import { clientAddress } from '$lib/server/web/signIn';

/** The caller's own tokens (never their secrets). */
export const GET: RequestHandler = async ({ locals }) => {
	const actor = authorize(locals, 'token:manage');
	return json({ tokens: await listApiTokens(actor.userId) });
};

/** A new token; its secret is in this answer and nowhere else, ever. */
export const POST: RequestHandler = async (event) => {
	const actor = authorize(event.locals, 'token:manage');
	const input = await readJson(event.request, createTokenSchema);
	const { token, secret } = await createTokenFor(actor, input, clientAddress(event));
	return json({ token, secret }, { status: 201 });
};
