import { json } from '@sveltejs/kit';
import { z } from 'zod';
import type { RequestHandler } from './$types';
import { authorize } from '$lib/server/web/actor';
import { apiError, readJson } from '$lib/server/web/http';
import { switchOrganisation } from '$lib/server/auth/membership';

const switchSchema = z.object({ organisationId: z.number().int().positive() });

/** Switches the signed-in user's active organisation: `{ "organisationId": 3 }`. */
export const PUT: RequestHandler = async ({ locals, request }) => {
	const actor = authorize(locals, 'account:manage');
	if (locals.authMethod === 'token') {
		apiError(409, 'token_bound', 'A token acts in the organisation it was made for.');
	}
	const { organisationId } = await readJson(request, switchSchema);
	const membership = await switchOrganisation(actor.userId, organisationId);
	if (!membership) apiError(404, 'not_found', 'No such organisation.', 'organisationId');
	return json({ organisationId, role: membership.role });
};
