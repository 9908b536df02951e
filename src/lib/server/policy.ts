import { error } from '@sveltejs/kit';
import type { Role } from './db/models/Membership';

/**
 * The one permission matrix: role × action → allowed. Every load, form action and +server.ts
 * route asks it (through `authorize`), so a role's rights are read and changed here only.
 * docs/roles.md explains each row and why it differs from the starting matrix, if it does.
 */
export const ACTIONS = [
	'dashboard:read',
	'asset:read',
	'asset:write',
	'research:consent',
	'survey:read',
	'survey:create',
	'survey:edit',
	'survey:submit',
	'survey:review',
	'survey:plan',
	'member:write',
	'reading:import',
	'reading:edit',
	'hole:write',
	'measurement:write',
	'attachment:upload',
	'attachment:read',
	'population:read',
	'assessment:read',
	'assessment:write',
	'assessment:approve',
	'report:read',
	'report:share',
	'organisation:manage',
	'audit:read',
	'mail:read',
	'research:read',
	'research:export',
	'token:manage',
	'account:manage'
] as const;

export type Action = (typeof ACTIONS)[number];

const everyone: Action[] = ['dashboard:read', 'account:manage'];

const engineer: Action[] = [
	...everyone,
	'asset:read',
	'asset:write',
	'survey:read',
	'survey:create',
	'survey:edit',
	'survey:submit',
	'survey:review',
	'survey:plan',
	'member:write',
	'reading:import',
	'reading:edit',
	'hole:write',
	'measurement:write',
	'attachment:upload',
	'attachment:read',
	'population:read',
	'assessment:read',
	'assessment:write',
	'assessment:approve',
	'report:read',
	'report:share',
	'token:manage'
];

export const PERMISSIONS: Record<Role, ReadonlySet<Action>> = {
	admin: new Set(ACTIONS),
	engineer: new Set(engineer),
	surveyor: new Set<Action>([
		...everyone,
		'asset:read',
		'survey:read',
		'survey:create',
		'survey:edit',
		'survey:submit',
		'member:write',
		'reading:import',
		'reading:edit',
		'hole:write',
		'measurement:write',
		'attachment:upload',
		'attachment:read',
		// Live population figures, to check a survey before handing it over; no sign-off.
		'population:read',
		'token:manage'
	]),
	owner: new Set<Action>([...everyone, 'asset:read', 'assessment:read', 'report:read']),
	researcher: new Set<Action>([...everyone, 'research:read', 'research:export', 'token:manage'])
};

export function can(role: Role, action: Action): boolean {
	return PERMISSIONS[role].has(action);
}

/** Who is asking: the signed-in user (or token holder) in their active organisation. */
export interface Actor {
	userId: number;
	organisationId: number;
	role: Role;
}

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
