/**
 * Account security over HTTP against the built app: where sign-in may send someone afterwards,
 * what a failed password form sends back, what a password reset or change ends, and whose mail
 * the development outbox shows (docs/security.md).
 */
import { describe, expect, it } from 'vitest';
import { startBuiltApp } from '../helpers/server';
import {
	anonymousClient,
	signIn,
	signInAs,
	tokenClient,
	type HttpClient
} from '../helpers/session';
import { FRESH_PASSWORD, signUpNewOrganisation, uniqueEmail } from '../helpers/accounts';
import { linkIn, waitForMail } from '../helpers/mail';

async function newToken(client: HttpClient): Promise<string> {
	const made = await client.postJson('/api/v1/tokens', { name: 'field tablet', expiresInDays: 30 });
	expect(made.status).toBe(201);
	return ((await made.json()) as { secret: string }).secret;
}

const withToken = (secret: string) => tokenClient(secret).get('/api/v1/me');

async function resetLinkFor(email: string, nth = 1): Promise<string> {
	const asked = await anonymousClient().postForm('/forgot-password', { email });
	expect(asked.status).toBe(303);
	return linkIn(await waitForMail(email, nth), '/reset-password/');
}

describe('sign-in sends back only to a path of our own site (open redirect)', () => {
	const cases: [string, string][] = [
		['/%09/evil.example', '/dashboard'],
		['/%0a/x', '/dashboard'],
		['/%0d%0a/evil.example', '/dashboard'],
		['/.//evil.example', '/dashboard'],
		['/%5c/evil.example', '/dashboard'],
		['https://evil.example/', '/dashboard'],
		['/assets?q=Br%C3%BCcke', '/assets?q=Br%C3%BCcke']
	];

	it('when already signed in, a tab, newline or backslash in next lands on the dashboard, never a 500', async () => {
		const admin = await signInAs('admin');
		for (const [next, expected] of cases) {
			const response = await admin.get(`/sign-in?next=${next}`);
			expect(response.status, next).toBe(303);
			expect(response.headers.get('location'), next).toBe(expected);
		}
	});

	it('after signing in, the same', async () => {
		const { email } = await signUpNewOrganisation('next');
		for (const [next, expected] of cases.slice(0, 3)) {
			const response = await anonymousClient().postForm(`/sign-in?next=${next}`, {
				email,
				password: FRESH_PASSWORD
			});
			expect(response.status, next).toBe(303);
			expect(response.headers.get('location'), next).toBe(expected);
		}
	});
});

describe('a failed password form never sends a password back', () => {
	const typed = 'slate-harbour-copper-61';

	it('a failed password reset answers 400 without the new password, under any field name', async () => {
		const tries: Record<string, string>[] = [
			{ password: typed },
			{ password: typed, confirm: typed },
			{ password: typed, pw: typed, repeat: typed }
		];
		for (const fields of tries) {
			const page = await anonymousClient().postForm('/reset-password/no-such-link', fields);
			expect(page.status).toBe(400);
			expect(await page.text()).not.toContain(typed);
			const enhanced = await fetch(new URL('/reset-password/no-such-link', page.url), {
				method: 'POST',
				body: new URLSearchParams(fields),
				headers: { origin: new URL(page.url).origin, 'x-sveltekit-action': 'true' }
			});
			const body = await enhanced.text();
			expect(body).toContain('"status":400');
			expect(body).not.toContain(typed);
		}
	});

	it('sign-up, the account page and an invitation do not echo one either', async () => {
		const { email, client } = await signUpNewOrganisation('echo');
		const signUp = await anonymousClient().postForm('/sign-up', {
			displayName: 'Echo',
			email,
			organisationName: 'Echo test organisation',
			password: typed,
			confirm: typed
		});
		expect(signUp.status).toBe(400);
		expect(await signUp.text()).not.toContain(typed);
		const change = await client.postForm('/account?/password', {
			currentPassword: 'not-my-password',
			newPassword: typed,
			again: typed
		});
		expect(change.status).toBe(400);
		expect(await change.text()).not.toContain(typed);
		const invitation = await anonymousClient().postForm('/invitations/no-such-link?/create', {
			displayName: 'Echo',
			password: typed,
			confirm: typed
		});
		expect(invitation.status).toBeGreaterThanOrEqual(400);
		expect(await invitation.text()).not.toContain(typed);
	});
});

describe('a password reset or change ends API tokens too (tokens surviving a reset)', () => {
	it('a reset revokes every API token of the account', async () => {
		const { email, client } = await signUpNewOrganisation('reset-tokens');
		const secret = await newToken(client);
		expect((await withToken(secret)).status).toBe(200);
		const link = await resetLinkFor(email);
		const set = await anonymousClient().postForm(link, { password: 'quarry-lantern-velvet-28' });
		expect(set.status).toBe(303);
		const after = await withToken(secret);
		expect(after.status).toBe(401);
		const fresh = await newToken(await signIn(email, 'quarry-lantern-velvet-28'));
		expect((await withToken(fresh)).status).toBe(200);
	});

	it('a password change revokes them as well', async () => {
		const { client } = await signUpNewOrganisation('change-tokens');
		const secret = await newToken(client);
		expect((await withToken(secret)).status).toBe(200);
		const changed = await client.postForm('/account?/password', {
			currentPassword: FRESH_PASSWORD,
			newPassword: 'basalt-meadow-kettle-93'
		});
		expect(changed.status).toBe(303);
		expect((await withToken(secret)).status).toBe(401);
		const tokens = await (await client.get('/api/v1/tokens')).json();
		expect(tokens.tokens.every((t: { revokedAt: string | null }) => t.revokedAt !== null)).toBe(
			true
		);
	});
});

describe('the development outbox shows only your own mail (account takeover through it)', () => {
	it('never shows a reset link sent to someone of another organisation', async () => {
		const victim = await signUpNewOrganisation('victim');
		const attacker = await signUpNewOrganisation('attacker');
		const victimLink = await resetLinkFor(victim.email);
		const ownLink = await resetLinkFor(attacker.email);
		const page = await attacker.client.get('/dev/outbox');
		expect(page.status).toBe(200);
		const html = await page.text();
		expect(html).toContain(`To ${attacker.email}`);
		expect(html).toContain(ownLink.split('/').pop());
		expect(html).not.toContain(victim.email);
		expect(html).not.toContain(victimLink.split('/').pop());
	});

	it('shows an admin none of the invitations they sent, and any role their own mail', async () => {
		const admin = await signInAs('admin');
		const invited = uniqueEmail('invited');
		await admin.postForm('/organisation/members?/invite', { email: invited, role: 'researcher' });
		await waitForMail(invited);
		const adminPage = await (await admin.get('/dev/outbox')).text();
		expect(adminPage).not.toContain(invited);
		const shownTo = [...adminPage.matchAll(/To ([^\s<]+) ·/g)].map((m) => m[1]);
		expect(shownTo.every((to) => to === 'admin@kestrel-lane.example')).toBe(true);
		const surveyor = await (await signInAs('surveyor')).get('/dev/outbox');
		expect(surveyor.status).toBe(200);
		const surveyorTo = [...(await surveyor.text()).matchAll(/To ([^\s<]+) ·/g)].map((m) => m[1]);
		expect(surveyorTo.every((to) => to === 'surveyor@kestrel-lane.example')).toBe(true);
	});

	it('does not exist (404) where the instance does not say it is a development or demo one', async () => {
		const app = await startBuiltApp({ DEV_OUTBOX: '0' });
		try {
			const admin = await signInAs('admin', app.origin);
			expect((await admin.get('/dev/outbox')).status).toBe(404);
		} finally {
			await app.stop();
		}
	});
});
