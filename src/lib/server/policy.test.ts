import { describe, expect, it } from 'vitest';
import { ACTIONS, authorize, can, PERMISSIONS } from './policy';

const locals = (role: keyof typeof PERMISSIONS | null, signedIn = true) =>
	({
		user: signedIn ? { id: 1, email: 'a@b.example', displayName: 'A' } : null,
		session: null,
		membership: role ? { organisationId: 7, organisationName: 'Org', role } : null,
		authMethod: signedIn ? 'session' : null,
		requestId: 'test'
	}) as App.Locals;

describe('the permission matrix (docs/roles.md)', () => {
	it('gives the admin every action', () => {
		for (const action of ACTIONS) expect(can('admin', action)).toBe(true);
	});

	it('keeps people and roles, the audit log and mail to admins', () => {
		for (const role of ['engineer', 'surveyor', 'owner', 'researcher'] as const) {
			expect(can(role, 'organisation:manage')).toBe(false);
			expect(can(role, 'audit:read')).toBe(false);
			expect(can(role, 'mail:read')).toBe(false);
		}
	});

	it('lets engineers approve and surveyors not', () => {
		expect(can('engineer', 'assessment:approve')).toBe(true);
		expect(can('surveyor', 'assessment:approve')).toBe(false);
		expect(can('surveyor', 'survey:submit')).toBe(true);
	});

	it('gives owners read-only rights and no tokens; researchers no asset records', () => {
		const ownerWrites = [...PERMISSIONS.owner].filter((a) => !/:read$/.test(a));
		expect(ownerWrites).toEqual(['account:manage']);
		expect(can('researcher', 'asset:read')).toBe(false);
		expect(can('researcher', 'token:manage')).toBe(true);
		expect(can('researcher', 'research:export')).toBe(true);
	});
});

describe('authorize', () => {
	it('answers 401 when signed out, 403 for a role without the right', () => {
		expect(() => authorize(locals(null, false), 'dashboard:read')).toThrow(
			expect.objectContaining({ status: 401 })
		);
		expect(() => authorize(locals('owner'), 'token:manage')).toThrow(
			expect.objectContaining({ status: 403 })
		);
		expect(() => authorize(locals(null), 'dashboard:read')).toThrow(
			expect.objectContaining({ status: 403 })
		);
	});

	it('returns the actor when allowed', () => {
		expect(authorize(locals('engineer'), 'survey:review')).toEqual({
			userId: 1,
			organisationId: 7,
			role: 'engineer'
		});
	});
});
