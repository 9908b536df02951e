import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { authorize } from '$lib/server/web/actor';

/** Who the caller is, in which organisation and role, and how they proved it. */
export const GET: RequestHandler = async ({ locals }) => {
	const actor = authorize(locals, 'dashboard:read');
	return json({
		user: { id: actor.userId, email: locals.user!.email, displayName: locals.user!.displayName },
		organisation: { id: actor.organisationId, name: locals.membership!.organisationName },
		role: actor.role,
		authMethod: locals.authMethod
	});
};
