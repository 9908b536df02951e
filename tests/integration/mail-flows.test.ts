import { describe, expect, it } from 'vitest';
import {
	anonymousClient,
	signIn,
	signInAs,
	sessionCookieFrom,
	httpClient
} from '../helpers/session';
import { FRESH_PASSWORD, signUpNewOrganisation, uniqueEmail } from '../helpers/accounts';
import { linkIn, mailsTo, waitForMail } from '../helpers/mail';

describe('invitation by e-mail, end to end through the SMTP fake', () => {
	it('a newcomer follows the link, sets name and password, and joins with the role', async () => {
		const admin = await signInAs('admin');
		const email = uniqueEmail('invitee');
		const invite = await admin.postForm('/organisation/members?/invite', {
			email,
			role: 'surveyor'
		});
		expect(invite.status).toBe(303);

		const mail = await waitForMail(email);
		expect(mail.subject).toContain('Kestrel Lane Consulting');
		const link = linkIn(mail, '/invitations/');
		const page = await anonymousClient().get(link);
		expect(page.status).toBe(200);
		expect(await page.text()).toContain('surveyor');

		const refused = await anonymousClient().postForm(`${link}?/create`, {
			displayName: 'Nell',
			password: 'short'
		});
		expect(refused.status).toBe(400);
		expect(await refused.text()).toContain('value="Nell"');

		const accepted = await anonymousClient().postForm(`${link}?/create`, {
			displayName: 'Nell Invited',
			password: FRESH_PASSWORD
		});
		expect(accepted.status).toBe(303);
		const newcomer = httpClient({}, sessionCookieFrom(accepted)!);
		const me = await (await newcomer.get('/api/v1/me')).json();
		expect(me).toMatchObject({
			role: 'surveyor',
			organisation: { name: 'Kestrel Lane Consulting' }
		});

		// Single use: the same link no longer works.
		const again = await anonymousClient().postForm(`${link}?/create`, {
			displayName: 'Again',
			password: FRESH_PASSWORD
		});
		expect(again.status).toBe(400);
		expect(await again.text()).toContain('already used');
	});

	it('someone with an account joins with it and can switch between organisations', async () => {
		const { email, client } = await signUpNewOrganisation('joiner');
		const admin = await signInAs('admin');
		await admin.postForm('/organisation/members?/invite', { email, role: 'engineer' });
		const link = linkIn(await waitForMail(email), '/invitations/');
		expect(await (await anonymousClient().get(link)).text()).toContain('Sign in to accept');
		expect((await client.postForm(`${link}?/join`)).status).toBe(303);
		const me = await (await client.get('/api/v1/me')).json();
		expect(me).toMatchObject({
			role: 'engineer',
			organisation: { name: 'Kestrel Lane Consulting' }
		});
		const dashboard = await (await client.get('/dashboard')).text();
		expect(dashboard).toContain('id="organisation-switch"');
	});

	it('an admin sees the invitation and the audit log records it', async () => {
		const admin = await signInAs('admin');
		const email = uniqueEmail('audited');
		await admin.postForm('/organisation/members?/invite', { email, role: 'owner' });
		expect(await (await admin.get('/organisation/members')).text()).toContain(email);
		expect(await (await admin.get('/organisation/audit')).text()).toContain('invitation.created');
	});
});

describe('password reset by e-mail, end to end through the SMTP fake', () => {
	it('a link sets a new password once; an earlier link dies; every session ends', async () => {
		const { email, client } = await signUpNewOrganisation('reset');
		const ask = () => anonymousClient().postForm('/forgot-password', { email });
		expect((await ask()).status).toBe(303);
		const first = linkIn(await waitForMail(email, 1), '/reset-password/');
		expect((await ask()).status).toBe(303);
		const second = linkIn(await waitForMail(email, 2), '/reset-password/');
		expect(first).not.toBe(second);

		expect(await (await anonymousClient().get(first)).text()).toContain(
			'expired or was already used'
		);
		const set = await anonymousClient().postForm(second, { password: 'quarry-lantern-velvet-28' });
		expect(set.status).toBe(303);
		expect(set.headers.get('location')).toBe('/sign-in?reset=done');

		expect((await client.get('/api/v1/me')).status).toBe(401);
		await expect(signIn(email, FRESH_PASSWORD)).rejects.toThrow(/failed/);
		expect((await (await signIn(email, 'quarry-lantern-velvet-28')).get('/api/v1/me')).status).toBe(
			200
		);
		const reuse = await anonymousClient().postForm(second, {
			password: 'another-fresh-passphrase-11'
		});
		expect(reuse.status).toBe(400);
	});

	it('answers an unknown address exactly as a known one, and sends nothing', async () => {
		const email = uniqueEmail('unknown');
		const response = await anonymousClient().postForm('/forgot-password', { email });
		expect(response.status).toBe(303);
		expect(response.headers.get('location')).toBe('/forgot-password?sent');
		await new Promise((r) => setTimeout(r, 300));
		expect(await mailsTo(email)).toHaveLength(0);
	});
});

describe('the development outbox', () => {
	it('shows each person the mail the SMTP fake received for their own address only', async () => {
		const { email, client } = await signUpNewOrganisation('outbox');
		await anonymousClient().postForm('/forgot-password', { email });
		await waitForMail(email);
		const page = await client.get('/dev/outbox');
		expect(page.status).toBe(200);
		expect(await page.text()).toContain(`To ${email}`);
		const surveyorPage = await (await signInAs('surveyor')).get('/dev/outbox');
		expect(surveyorPage.status).toBe(200);
		expect(await surveyorPage.text()).not.toContain(email);
	});
});
