import { createHash } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { QueryTypes } from 'sequelize';
import {
	anonymousClient,
	DEMO_USERS,
	signIn,
	signInAs,
	sessionCookieFrom
} from '../helpers/session';
import { FRESH_PASSWORD, signUpNewOrganisation } from '../helpers/accounts';
import { testSequelize } from '../helpers/database';

const REFUSED = 'That e-mail address and password do not match an account.';

describe('sign-in', () => {
	it('sets an httpOnly, SameSite=Lax session cookie and lands on the dashboard', async () => {
		const response = await anonymousClient().postForm('/sign-in?next=%2Faccount', {
			email: DEMO_USERS.engineer,
			password: 'cover-check-demo-2026'
		});
		expect(response.status).toBe(303);
		expect(response.headers.get('location')).toBe('/account');
		const header = response.headers.getSetCookie().find((c) => c.startsWith('fractile_session='));
		expect(header).toMatch(/HttpOnly/i);
		expect(header).toMatch(/SameSite=Lax/i);
		// Stored as its sha256 only: the sessions table is no list of usable cookies.
		const value = header!.split(';')[0].split('=')[1];
		const db = testSequelize();
		const rows = await db.query<{ id: string }>(
			'SELECT id FROM sessions WHERE id = ? OR id = SHA2(?, 256)',
			{
				replacements: [value, value],
				type: QueryTypes.SELECT
			}
		);
		await db.close();
		expect(rows.map((r) => r.id)).toEqual([createHash('sha256').update(value).digest('hex')]);
	});

	it('gives the same message for an unknown address and a wrong password, and keeps the address', async () => {
		const unknown = await anonymousClient().postForm('/sign-in', {
			email: 'nobody-here@tests.example',
			password: 'whatever-it-may-be'
		});
		const wrong = await anonymousClient().postForm('/sign-in', {
			email: DEMO_USERS.surveyor,
			password: 'not-the-right-password'
		});
		expect(unknown.status).toBe(400);
		expect(wrong.status).toBe(400);
		const [a, b] = [await unknown.text(), await wrong.text()];
		expect(a).toContain(REFUSED);
		expect(b).toContain(REFUSED);
		expect(b).toContain(`value="${DEMO_USERS.surveyor}"`);
		expect(b).not.toContain('not-the-right-password');
	});

	it('shows a zod message beside each empty field', async () => {
		const response = await anonymousClient().postForm('/sign-in', {
			email: 'not-an-address',
			password: ''
		});
		const html = await response.text();
		expect(response.status).toBe(400);
		expect(html).toContain('Enter an e-mail address such as name@example.com.');
		expect(html).toContain('Enter your password.');
	});

	it('refuses a cross-site form post (SvelteKit origin check kept on)', async () => {
		const response = await fetch(new URL('/sign-in', process.env.APP_URL), {
			method: 'POST',
			redirect: 'manual',
			headers: {
				'content-type': 'application/x-www-form-urlencoded',
				origin: 'https://evil.example'
			},
			body: new URLSearchParams({ email: DEMO_USERS.admin, password: 'cover-check-demo-2026' })
		});
		expect(response.status).toBe(403);
	});
});

describe('sign-up', () => {
	it('creates an organisation with its creator as admin', async () => {
		const { client } = await signUpNewOrganisation('signup');
		const me = await (await client.get('/api/v1/me')).json();
		expect(me.role).toBe('admin');
		expect(me.organisation.name).toMatch(/^Test organisation signup/);
	});

	it('refuses a short or common password, beside the field, keeping the other values', async () => {
		const form = {
			displayName: 'Ada Short',
			email: 'ada-short@tests.example',
			organisationName: 'Short Ltd'
		};
		const short = await anonymousClient().postForm('/sign-up', { ...form, password: 'short-pw' });
		const common = await anonymousClient().postForm('/sign-up', {
			...form,
			password: 'password1234'
		});
		expect(short.status).toBe(400);
		const shortHtml = await short.text();
		expect(shortHtml).toContain('Use at least 12 characters.');
		expect(shortHtml).toContain('value="Short Ltd"');
		expect(await common.text()).toContain('commonly used passwords');
		const db = testSequelize();
		const rows = await db.query('SELECT id FROM users WHERE email = ?', {
			replacements: ['ada-short@tests.example'],
			type: QueryTypes.SELECT
		});
		await db.close();
		expect(rows).toHaveLength(0);
	});
});

describe('sign-out', () => {
	it('refuses the cookie afterwards on pages, form actions and the API', async () => {
		const client = await signInAs('engineer');
		expect((await client.get('/api/v1/me')).status).toBe(200);
		const out = await client.postForm('/sign-out?/device');
		expect(out.status).toBe(303);
		expect((await client.get('/api/v1/me')).status).toBe(401);
		const page = await client.get('/dashboard');
		expect(page.status).toBe(303);
		expect(page.headers.get('location')).toBe('/sign-in?next=%2Fdashboard');
		const action = await client.postForm('/account/tokens?/create', { name: 'x' });
		expect(action.status).toBe(303);
		expect(action.headers.get('location')).toMatch(/^\/sign-in\?next=/);
	});

	it('"on all devices" ends every session of the account', async () => {
		const { email, client: first } = await signUpNewOrganisation('everywhere');
		const second = await signIn(email, FRESH_PASSWORD);
		expect((await second.get('/api/v1/me')).status).toBe(200);
		expect((await first.postForm('/sign-out?/everywhere')).status).toBe(303);
		expect((await first.get('/api/v1/me')).status).toBe(401);
		expect((await second.get('/api/v1/me')).status).toBe(401);
		expect((await second.get('/account')).status).toBe(303);
	});

	it('ending one other device from the account page signs that device out only', async () => {
		const { email, client: first } = await signUpNewOrganisation('device');
		const second = await signIn(email, FRESH_PASSWORD);
		const page = await (await first.get('/account/sessions')).text();
		const handles = [...page.matchAll(/name="handle" value="([0-9a-f]{24})"/g)].map((m) => m[1]);
		expect(handles).toHaveLength(1);
		expect((await first.postForm('/account/sessions?/end', { handle: handles[0] })).status).toBe(
			303
		);
		expect((await second.get('/api/v1/me')).status).toBe(401);
		expect((await first.get('/api/v1/me')).status).toBe(200);
	});
});

describe('change password', () => {
	it('needs the current password, then signs out the other devices', async () => {
		const { email, client } = await signUpNewOrganisation('change');
		const other = await signIn(email, FRESH_PASSWORD);
		const wrong = await client.postForm('/account?/password', {
			currentPassword: 'not-my-password',
			newPassword: 'basalt-meadow-kettle-93'
		});
		expect(wrong.status).toBe(400);
		expect(await wrong.text()).toContain('This is not your current password.');
		const right = await client.postForm('/account?/password', {
			currentPassword: FRESH_PASSWORD,
			newPassword: 'basalt-meadow-kettle-93'
		});
		expect(right.status).toBe(303);
		expect((await client.get('/api/v1/me')).status).toBe(200);
		expect((await other.get('/api/v1/me')).status).toBe(401);
		await expect(signIn(email, FRESH_PASSWORD)).rejects.toThrow(/failed/);
		expect(
			sessionCookieFrom(
				await anonymousClient().postForm('/sign-in', { email, password: 'basalt-meadow-kettle-93' })
			)
		).toBeTruthy();
	});
});
