import { describe, expect, it } from 'vitest';
import { ACTIONS, can, PERMISSIONS } from '../../src/lib/server/policy';

// The starting matrix is the one the sign-in issue states; docs/roles.md records any change.
describe('the permission matrix', () => {
	it('lets an admin do everything in the organisation', () => {
		for (const action of ACTIONS) expect(can('admin', action)).toBe(true);
	});

	it('lets only engineers and admins approve', () => {
		expect(can('engineer', 'assessment:approve')).toBe(true);
		expect(can('engineer', 'survey:review')).toBe(true);
		for (const role of ['surveyor', 'owner', 'researcher'] as const) {
			expect(can(role, 'assessment:approve')).toBe(false);
			expect(can(role, 'survey:review')).toBe(false);
		}
	});

	it('lets surveyors bring readings in but not judge them', () => {
		for (const action of [
			'survey:create',
			'member:write',
			'reading:import',
			'attachment:upload',
			'survey:submit'
		] as const) {
			expect(can('surveyor', action)).toBe(true);
		}
		expect(can('surveyor', 'assessment:write')).toBe(false);
		expect(can('surveyor', 'organisation:manage')).toBe(false);
	});

	it('gives owners read access to assessments and reports only', () => {
		expect(can('owner', 'assessment:read')).toBe(true);
		expect(can('owner', 'report:read')).toBe(true);
		for (const action of [
			'asset:write',
			'reading:import',
			'assessment:write',
			'research:read'
		] as const) {
			expect(can('owner', action)).toBe(false);
		}
	});

	it('keeps researchers to anonymised data, exports and tokens', () => {
		const allowed = [...PERMISSIONS.researcher].sort();
		expect(allowed).toEqual([
			'account:manage',
			'dashboard:read',
			'research:export',
			'research:read',
			'token:manage'
		]);
	});
});
