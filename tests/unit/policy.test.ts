import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { ACTIONS, can, PERMISSIONS } from '$lib/server/policy';

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

describe('docs/roles.md and the matrix agree', () => {
	const ROLE_COLUMNS = ['admin', 'engineer', 'surveyor', 'owner', 'researcher'] as const;

	/** The matrix table of docs/roles.md: action → the roles it ticks. */
	function documentedMatrix(): Map<string, Set<string>> {
		const text = readFileSync(
			fileURLToPath(new URL('../../docs/roles.md', import.meta.url)),
			'utf8'
		);
		const rows = new Map<string, Set<string>>();
		for (const line of text.split('\n')) {
			const cells = line.split('|').map((c) => c.trim());
			if (cells.length < 9 || !cells[1].startsWith('`')) continue;
			const ticks = cells.slice(3, 8);
			for (const action of cells[1].matchAll(/`([a-z]+:[a-z]+)`/g)) {
				rows.set(action[1], new Set(ROLE_COLUMNS.filter((_, i) => ticks[i] === '✔')));
			}
		}
		return rows;
	}

	/** Every source file outside the policy itself, as text. */
	function sourceTexts(dir = fileURLToPath(new URL('../../src/', import.meta.url))): string[] {
		return readdirSync(dir, { withFileTypes: true, recursive: true })
			.filter(
				(f) => f.isFile() && /\.(ts|svelte)$/.test(f.name) && !/policy(\.test)?\.ts$/.test(f.name)
			)
			.map((f) => readFileSync(join(f.parentPath, f.name), 'utf8'));
	}

	it('documents every action of the matrix (population:read among them) with the same roles, and no other', () => {
		const documented = documentedMatrix();
		expect([...documented.keys()].sort()).toEqual([...ACTIONS].sort());
		for (const action of ACTIONS) {
			const roles = ROLE_COLUMNS.filter((role) => can(role, action));
			expect([...documented.get(action)!].sort(), action).toEqual([...roles].sort());
		}
	});

	it('has no action that no route or service asks for (no asset:share kept on paper only)', () => {
		const texts = sourceTexts();
		for (const action of ACTIONS) {
			expect(
				texts.some((t) => t.includes(`'${action}'`)),
				action
			).toBe(true);
		}
	});
});

// The starting matrix is the one the sign-in issue states; docs/roles.md records any change.
describe('the permission matrix, role by role', () => {
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
