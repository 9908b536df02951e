import type { Role } from './db/models/Membership';

/**
 * The one permission matrix: role × action → allowed. Every load, form action and +server.ts
 * route asks it (through `authorize` in web/actor.ts), so a role's rights are read and changed here only.
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
