import { describe, expect, it } from 'vitest';
import type { PERMISSIONS } from '$lib/server/policy';
import { authorize } from '$lib/server/web/actor';

const locals = (role: keyof typeof PERMISSIONS | null, signedIn = true) =>
	({
		user: signedIn ? { id: 1, email: 'a@b.example', displayName: 'A' } : null,
		session: null,
		membership: role ? { organisationId: 7, organisationName: 'Org', role } : null,
		authMethod: signedIn ? 'session' : null,
		requestId: 'test'
	}) as App.Locals;

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
