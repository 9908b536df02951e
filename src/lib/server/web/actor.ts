import { error } from '@sveltejs/kit';
import { can, type Action, type Actor } from '../policy';

/** The actor of a request, or 401 when nobody is signed in (routes redirect pages themselves). */
export function requireActor(locals: App.Locals): Actor {
	if (!locals.user) error(401, 'Sign in to continue.');
	if (!locals.membership) error(403, 'You are not a member of any organisation.');
	return {
		userId: locals.user.id,
		organisationId: locals.membership.organisationId,
		role: locals.membership.role
	};
}

/** The actor, if they may do `action`; 401 when signed out, 403 when their role may not. */
export function authorize(locals: App.Locals, action: Action): Actor {
	const actor = requireActor(locals);
	if (!can(actor.role, action)) {
		error(403, `Your role (${actor.role}) does not allow this.`);
	}
	return actor;
}
