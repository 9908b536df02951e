import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { QueryTypes, type Sequelize } from 'sequelize';
import { signInAs, tokenClient, type HttpClient } from '../helpers/session';
import { testSequelize } from '../helpers/database';

let db: Sequelize;
let researcher: HttpClient;

beforeAll(async () => {
	db = testSequelize();
	researcher = await signInAs('researcher');
});
afterAll(async () => {
	await db.close();
});

async function newToken(name: string): Promise<{ id: number; secret: string }> {
	const response = await researcher.postJson('/api/v1/tokens', { name, expiresInDays: 30 });
	expect(response.status).toBe(201);
	const body = await response.json();
	return { id: body.token.id, secret: body.secret };
}

describe('API tokens', () => {
	it('act as their user with that user’s role, and record their last use', async () => {
		const { id, secret } = await newToken('script');
		expect(secret).toMatch(/^frt_[A-Za-z0-9_-]{43}$/);
		const me = await tokenClient(secret).get('/api/v1/me');
		expect(me.status).toBe(200);
		expect(await me.json()).toMatchObject({ role: 'researcher', authMethod: 'token' });
		const [row] = await db.query<{ token_hash: string; last_used_at: Date | null }>(
			'SELECT token_hash, last_used_at FROM api_tokens WHERE id = ?',
			{ replacements: [id], type: QueryTypes.SELECT }
		);
		expect(row.token_hash).not.toContain(secret);
		expect(row.token_hash).toMatch(/^[0-9a-f]{64}$/);
		expect(row.last_used_at).not.toBeNull();
	});

	it('are listed without their secret', async () => {
		const { secret } = await newToken('listed');
		const listing = await (await researcher.get('/api/v1/tokens')).text();
		expect(listing).toContain('listed');
		expect(listing).not.toContain(secret);
		expect(listing).toContain(secret.slice(0, 12));
	});

	it('are refused once revoked', async () => {
		const { id, secret } = await newToken('to revoke');
		expect((await tokenClient(secret).get('/api/v1/me')).status).toBe(200);
		expect((await researcher.delete(`/api/v1/tokens/${id}`)).status).toBe(200);
		const refused = await tokenClient(secret).get('/api/v1/me');
		expect(refused.status).toBe(401);
		expect((await refused.json()).error.code).toBe('unauthenticated');
	});

	it('are refused once expired', async () => {
		const { id, secret } = await newToken('to expire');
		await db.query('UPDATE api_tokens SET expires_at = NOW(3) - INTERVAL 1 MINUTE WHERE id = ?', {
			replacements: [id],
			type: QueryTypes.UPDATE
		});
		expect((await tokenClient(secret).get('/api/v1/me')).status).toBe(401);
	});

	it('are refused when made up, and do not open pages (only /api)', async () => {
		expect((await tokenClient('frt_' + 'x'.repeat(43)).get('/api/v1/me')).status).toBe(401);
		const { secret } = await newToken('no pages');
		const page = await tokenClient(secret).get('/dashboard');
		expect(page.status).toBe(303);
	});

	it('follow a role change at once (the role is read per request)', async () => {
		const admin = await signInAs('admin');
		const engineer = await signInAs('engineer');
		const created = await (
			await engineer.postJson('/api/v1/tokens', { name: 'role', expiresInDays: 1 })
		).json();
		const asEngineer = tokenClient(created.secret);
		expect((await asEngineer.get('/api/v1/organisation/members')).status).toBe(403);
		const [m] = await db.query<{ id: number }>(
			`SELECT m.id FROM memberships m JOIN users u ON u.id = m.user_id WHERE u.email = 'engineer@kestrel-lane.example'`,
			{ type: QueryTypes.SELECT }
		);
		expect(
			(await admin.patchJson(`/api/v1/organisation/members/${m.id}`, { role: 'admin' })).status
		).toBe(200);
		try {
			expect((await asEngineer.get('/api/v1/organisation/members')).status).toBe(200);
		} finally {
			await admin.patchJson(`/api/v1/organisation/members/${m.id}`, { role: 'engineer' });
		}
		expect((await asEngineer.get('/api/v1/organisation/members')).status).toBe(403);
	});
});
