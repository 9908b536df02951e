import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { QueryTypes, type Sequelize } from 'sequelize';
import {
	anonymousClient,
	DEMO_USERS,
	signInAs,
	type DemoRole,
	type HttpClient
} from '../helpers/session';
import { uniqueEmail } from '../helpers/accounts';
import { testSequelize } from '../helpers/database';

/**
 * For every role, one route of each kind — page load, form action, API read, API write — is
 * answered 401 (or a redirect to sign-in) when signed out, 403 for a role without the right and
 * 200 (303 after a form post) when allowed. The expectations mirror docs/roles.md.
 */
const ROLES: DemoRole[] = ['admin', 'engineer', 'surveyor', 'owner', 'researcher'];
type Expect = Record<DemoRole, number>;
const everyone = (status: number): Expect =>
	Object.fromEntries(ROLES.map((r) => [r, status])) as Expect;
const adminOnly = (allowed: number): Expect => ({ ...everyone(403), admin: allowed });
const notOwner = (allowed: number): Expect => ({ ...everyone(allowed), owner: 403 });

let db: Sequelize;
let clients: Record<DemoRole, HttpClient>;
let engineerMembershipId: number;
let organisationOf: Record<DemoRole, number>;

async function membershipOf(email: string): Promise<{ id: number; organisationId: number }> {
	const [row] = await db.query<{ id: number; organisationId: number }>(
		`SELECT m.id, m.organisation_id AS organisationId FROM memberships m
		 JOIN users u ON u.id = m.user_id WHERE u.email = ? ORDER BY m.id LIMIT 1`,
		{ replacements: [email], type: QueryTypes.SELECT }
	);
	return row;
}

beforeAll(async () => {
	db = testSequelize();
	const entries = await Promise.all(ROLES.map(async (r) => [r, await signInAs(r)] as const));
	clients = Object.fromEntries(entries) as Record<DemoRole, HttpClient>;
	engineerMembershipId = (await membershipOf(DEMO_USERS.engineer)).id;
	organisationOf = Object.fromEntries(
		await Promise.all(
			ROLES.map(async (r) => [r, (await membershipOf(DEMO_USERS[r])).organisationId])
		)
	) as Record<DemoRole, number>;
});
afterAll(async () => {
	await db.close();
});

interface Route {
	kind: 'page' | 'action' | 'api read' | 'api write';
	name: string;
	send: (client: HttpClient, role: DemoRole) => Promise<Response>;
	expected: Expect;
}

const routes: Route[] = [
	{
		kind: 'page',
		name: 'GET /dashboard',
		send: (c) => c.get('/dashboard'),
		expected: everyone(200)
	},
	{
		kind: 'page',
		name: 'GET /account/tokens',
		send: (c) => c.get('/account/tokens'),
		expected: notOwner(200)
	},
	{
		kind: 'page',
		name: 'GET /organisation/members',
		send: (c) => c.get('/organisation/members'),
		expected: adminOnly(200)
	},
	{
		kind: 'action',
		name: 'POST /switch-organisation',
		send: (c, role) =>
			c.postForm('/switch-organisation', { organisationId: String(organisationOf[role]) }),
		expected: everyone(303)
	},
	{
		kind: 'action',
		name: 'POST /account/tokens?/create',
		send: (c) => c.postForm('/account/tokens?/create', { name: 'matrix', expiresInDays: '1' }),
		expected: notOwner(200)
	},
	{
		kind: 'action',
		name: 'POST /organisation/members?/invite',
		send: (c) =>
			c.postForm('/organisation/members?/invite', {
				email: uniqueEmail('matrix'),
				role: 'surveyor'
			}),
		expected: adminOnly(303)
	},
	{
		kind: 'api read',
		name: 'GET /api/v1/me',
		send: (c) => c.get('/api/v1/me'),
		expected: everyone(200)
	},
	{
		kind: 'api read',
		name: 'GET /api/v1/tokens',
		send: (c) => c.get('/api/v1/tokens'),
		expected: notOwner(200)
	},
	{
		kind: 'api read',
		name: 'GET /api/v1/organisation/members',
		send: (c) => c.get('/api/v1/organisation/members'),
		expected: adminOnly(200)
	},
	{
		kind: 'api write',
		name: 'PUT /api/v1/me/organisation',
		send: (c, role) =>
			c.putJson('/api/v1/me/organisation', { organisationId: organisationOf[role] }),
		expected: everyone(200)
	},
	{
		kind: 'api write',
		name: 'POST /api/v1/tokens',
		send: (c) => c.postJson('/api/v1/tokens', { name: 'matrix', expiresInDays: 1 }),
		expected: notOwner(201)
	},
	{
		kind: 'api write',
		name: 'PATCH /api/v1/organisation/members/:id',
		// The engineer's own role again: allowed for the admin, and it changes nothing.
		send: (c) =>
			c.patchJson(`/api/v1/organisation/members/${engineerMembershipId}`, { role: 'engineer' }),
		expected: adminOnly(200)
	}
];

describe('signed out', () => {
	for (const route of routes) {
		// A refused form action inside (app) renders the error page with the (app) layout, whose
		// load sends the visitor to sign in: a redirect, as for pages.
		const redirects = route.kind === 'page' || route.kind === 'action';
		it(`${route.kind} ${route.name} → ${redirects ? 'redirect to sign-in' : '401'}`, async () => {
			const response = await route.send(anonymousClient(), 'admin');
			if (redirects) {
				expect(response.status).toBe(303);
				expect(response.headers.get('location')).toMatch(/^\/sign-in\?next=/);
			} else {
				expect(response.status).toBe(401);
			}
			if (route.kind.startsWith('api')) {
				expect((await response.json()).error.code).toBe('unauthenticated');
			}
		});
	}
});

describe.each(ROLES)('signed in as %s', (role) => {
	for (const route of routes) {
		it(`${route.kind} ${route.name} → ${route.expected[role]}`, async () => {
			const response = await route.send(clients[role], role);
			expect(response.status).toBe(route.expected[role]);
			if (route.kind.startsWith('api') && response.status === 403) {
				const body = await response.json();
				expect(body.error.code).toBe('forbidden');
				expect(body.error.message).toContain(role);
			}
		});
	}
});

describe('another organisation’s records are "not found", never "forbidden"', () => {
	it('page load: a member of another organisation', async () => {
		const foreign = await membershipOf(DEMO_USERS.owner);
		expect((await clients.admin.get(`/organisation/members/${engineerMembershipId}`)).status).toBe(
			200
		);
		expect((await clients.admin.get(`/organisation/members/${foreign.id}`)).status).toBe(404);
	});

	it('form action: removing a member of another organisation', async () => {
		const foreign = await membershipOf(DEMO_USERS.owner);
		const response = await clients.admin.postForm('/organisation/members?/remove', {
			id: String(foreign.id)
		});
		expect(response.status).toBe(404);
		expect((await membershipOf(DEMO_USERS.owner)).id).toBe(foreign.id);
	});

	it('form action: switching to an organisation one does not belong to', async () => {
		const response = await clients.engineer.postForm('/switch-organisation', {
			organisationId: String(organisationOf.owner)
		});
		expect(response.status).toBe(404);
	});

	it('API write: changing the role of another organisation’s member', async () => {
		const foreign = await membershipOf(DEMO_USERS.owner);
		const response = await clients.admin.patchJson(`/api/v1/organisation/members/${foreign.id}`, {
			role: 'admin'
		});
		expect(response.status).toBe(404);
		expect((await response.json()).error.code).toBe('not_found');
		const [row] = await db.query<{ role: string }>('SELECT role FROM memberships WHERE id = ?', {
			replacements: [foreign.id],
			type: QueryTypes.SELECT
		});
		expect(row.role).toBe('owner');
	});

	it('API write and form action: revoking someone else’s token', async () => {
		const created = await (
			await clients.researcher.postJson('/api/v1/tokens', { name: 'theirs', expiresInDays: 5 })
		).json();
		const id = created.token.id;
		expect((await clients.engineer.delete(`/api/v1/tokens/${id}`)).status).toBe(404);
		expect(
			(await clients.engineer.postForm('/account/tokens?/revoke', { id: String(id) })).status
		).toBe(404);
		const list = await (await clients.researcher.get('/api/v1/tokens')).json();
		expect(list.tokens.find((t: { id: number }) => t.id === id).revokedAt).toBeNull();
	});

	it('API read: members are listed for the caller’s own organisation only', async () => {
		const body = await (await clients.admin.get('/api/v1/organisation/members')).json();
		const emails = body.members.map((m: { email: string }) => m.email);
		expect(emails).toContain(DEMO_USERS.engineer);
		expect(emails).not.toContain(DEMO_USERS.owner);
	});

	it('form action: ending another person’s session by its handle', async () => {
		const page = await (await clients.researcher.get('/account/sessions')).text();
		expect(page).toContain('This device');
		const response = await clients.engineer.postForm('/account/sessions?/end', {
			handle: 'a'.repeat(24)
		});
		expect(response.status).toBe(404);
	});
});

describe('the API error shape', () => {
	it('answers unknown routes, bad JSON and bad fields as { error: { code, message, field? } }', async () => {
		const missing = await clients.admin.get('/api/v1/no-such-thing');
		expect(missing.status).toBe(404);
		expect((await missing.json()).error.code).toBe('not_found');
		const badJson = await fetch(new URL('/api/v1/tokens', process.env.APP_URL), {
			method: 'POST',
			headers: { cookie: clients.admin.cookie, 'content-type': 'application/json' },
			body: '{not json'
		});
		expect(badJson.status).toBe(400);
		expect((await badJson.json()).error.code).toBe('invalid_json');
		const badField = await clients.admin.postJson('/api/v1/tokens', { name: '', expiresInDays: 3 });
		expect(badField.status).toBe(400);
		expect((await badField.json()).error).toMatchObject({ code: 'invalid_input', field: 'name' });
	});
});
