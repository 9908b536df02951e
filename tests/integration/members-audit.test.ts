import { describe, expect, it } from 'vitest';
import { QueryTypes } from 'sequelize';
import { anonymousClient, signInAs } from '../helpers/session';
import { signUpNewOrganisation } from '../helpers/accounts';
import { testSequelize } from '../helpers/database';

async function ownMembershipId(client: Awaited<ReturnType<typeof signInAs>>): Promise<number> {
	const body = await (await client.get('/api/v1/organisation/members')).json();
	return body.members[0].id;
}

describe('the last admin', () => {
	it('can neither be removed nor lose the admin role, by page or API', async () => {
		const { client } = await signUpNewOrganisation('lastadmin');
		const id = await ownMembershipId(client);
		const demote = await client.patchJson(`/api/v1/organisation/members/${id}`, {
			role: 'engineer'
		});
		expect(demote.status).toBe(409);
		expect((await demote.json()).error.code).toBe('last_admin');
		expect((await client.delete(`/api/v1/organisation/members/${id}`)).status).toBe(409);
		const page = await client.postForm('/organisation/members?/remove', { id: String(id) });
		expect(page.status).toBe(400);
		expect(await page.text()).toContain('at least one admin');
		expect((await (await client.get('/api/v1/me')).json()).role).toBe('admin');
	});
});

describe('the audit log', () => {
	it('records sign-in, failed sign-in, token creation and revocation, readable by admins only', async () => {
		const { email, client } = await signUpNewOrganisation('audit');
		await anonymousClient().postForm('/sign-in', { email, password: 'wrong-password-here' });
		await anonymousClient().postForm('/sign-in', { email, password: 'granite-ladder-orbit-47' });
		const created = await (
			await client.postJson('/api/v1/tokens', { name: 'audited', expiresInDays: 2 })
		).json();
		await client.delete(`/api/v1/tokens/${created.token.id}`);
		const log = await (await client.get('/organisation/audit')).text();
		for (const action of [
			'organisation.created',
			'auth.sign_in_failed',
			'auth.sign_in',
			'token.created',
			'token.revoked'
		]) {
			expect(log, action).toContain(action);
		}
		expect((await (await signInAs('engineer')).get('/organisation/audit')).status).toBe(403);
	});

	it('records a role change with what it was and what it became', async () => {
		const admin = await signInAs('admin');
		const members = (await (await admin.get('/api/v1/organisation/members')).json()).members;
		const surveyor = members.find(
			(m: { email: string }) => m.email === 'surveyor@kestrel-lane.example'
		);
		expect(
			(await admin.patchJson(`/api/v1/organisation/members/${surveyor.id}`, { role: 'engineer' }))
				.status
		).toBe(200);
		await admin.patchJson(`/api/v1/organisation/members/${surveyor.id}`, { role: 'surveyor' });
		const db = testSequelize();
		const rows = await db.query<{ detail: unknown }>(
			`SELECT detail FROM audit_events WHERE action = 'membership.role_changed' AND subject_id = ? ORDER BY id`,
			{ replacements: [String(surveyor.id)], type: QueryTypes.SELECT }
		);
		await db.close();
		const details = rows.map((r) =>
			typeof r.detail === 'string' ? JSON.parse(r.detail) : r.detail
		);
		expect(details.slice(-2)).toMatchObject([
			{ from: 'surveyor', to: 'engineer' },
			{ from: 'engineer', to: 'surveyor' }
		]);
	});
});

describe('the approval rule', () => {
	it('is on for a new organisation; its admin turns it off and on, audited; an engineer may not', async () => {
		const { client } = await signUpNewOrganisation('approvalrule');
		const page = await (await client.get('/organisation/members')).text();
		expect(page).toContain('A second engineer must approve');
		const off = await client.postForm('/organisation/members?/approval', {
			secondApproverRequired: 'off'
		});
		expect(off.status).toBe(303);
		expect(await (await client.get('/organisation/members')).text()).toContain(
			'may approve it alone'
		);
		const bad = await client.postForm('/organisation/members?/approval', {
			secondApproverRequired: 'maybe'
		});
		expect(bad.status).toBe(400);
		await client.postForm('/organisation/members?/approval', { secondApproverRequired: 'on' });
		const log = await (await client.get('/organisation/audit')).text();
		expect(log).toContain('organisation.approval_rule_changed');
		const engineer = await signInAs('engineer');
		const refused = await engineer.postForm('/organisation/members?/approval', {
			secondApproverRequired: 'off'
		});
		expect(refused.status).toBe(403);
	});
});
