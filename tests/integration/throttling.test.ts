import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startBuiltApp } from '../helpers/server';
import { anonymousClient, httpClient } from '../helpers/session';
import { FRESH_PASSWORD, signUpNewOrganisation, uniqueEmail } from '../helpers/accounts';

/**
 * A second copy of the built app that trusts X-Forwarded-For (as behind a proxy), so each test
 * can sign in "from" an address of its own and the shared app's 127.0.0.1 count stays clean.
 * Rules (src/lib/server/auth/throttle-rules.ts): 5 free failures per account, 20 per address.
 */
let app: Awaited<ReturnType<typeof startBuiltApp>>;
beforeAll(async () => {
	app = await startBuiltApp({ ADDRESS_HEADER: 'x-forwarded-for', XFF_DEPTH: '1' });
});
afterAll(async () => {
	await app?.stop();
});

/** A made-up address block of its own per test and run, so no earlier count can interfere. */
function subnet(): string {
	const octet = () => 1 + Math.floor(Math.random() * 250);
	return `10.${octet()}.${octet()}`;
}

function fromAddress(address: string) {
	return httpClient({ 'x-forwarded-for': address }, '', app.origin);
}

async function attempt(address: string, email: string, password: string) {
	const response = await fromAddress(address).postForm('/sign-in', { email, password });
	return { status: response.status, html: await response.text() };
}

describe('sign-in throttling', () => {
	it('locks an account after 5 failures, says when to try again, even for the right password', async () => {
		const { email } = await signUpNewOrganisation('throttle', app.origin);
		const net = subnet();
		for (let i = 1; i <= 5; i++) {
			const failed = await attempt(`${net}.${i}`, email, 'wrong-password-here');
			expect(failed.html, `failure ${i} is not yet throttled`).not.toContain(
				'Too many failed sign-ins'
			);
		}
		const locked = await attempt(`${net}.99`, email, 'wrong-password-here');
		expect(locked.html).toMatch(/Too many failed sign-ins\. Try again in \d+ seconds/);
		const right = await attempt(`${net}.100`, email, FRESH_PASSWORD);
		expect(right.status).toBe(400);
		expect(right.html).toContain('Too many failed sign-ins');
	});

	it('before the lock, a right password signs in and clears the account’s count', async () => {
		const { email } = await signUpNewOrganisation('clears', app.origin);
		const address = `${subnet()}.1`;
		for (let i = 0; i < 4; i++) await attempt(address, email, 'wrong-password-here');
		const ok = await fromAddress(address).postForm('/sign-in', {
			email,
			password: FRESH_PASSWORD
		});
		expect(ok.status).toBe(303);
		for (let i = 0; i < 5; i++) {
			expect((await attempt(address, email, 'wrong-password-here')).html).not.toContain('Too many');
		}
	});

	it('locks an address after 20 failures across accounts, with the same message for unknown users', async () => {
		const net = subnet();
		const address = `${net}.1`;
		for (let i = 1; i <= 20; i++) {
			const failed = await attempt(address, uniqueEmail(`spray${i}`), 'some-guess-or-other');
			expect(failed.html).toContain('do not match an account');
		}
		const locked = await attempt(address, uniqueEmail('spray21'), 'some-guess-or-other');
		expect(locked.html).toContain('Too many failed sign-ins');
		const elsewhere = await attempt(`${net}.2`, uniqueEmail('other'), 'some-guess-or-other');
		expect(elsewhere.html).toContain('do not match an account');
	});

	it('is kept in MariaDB, so the other app process sees the same lock', async () => {
		const email = uniqueEmail('shared');
		const net = subnet();
		for (let i = 0; i < 6; i++) await attempt(`${net}.${i}`, email, 'wrong-password-here');
		const viaMainApp = await anonymousClient().postForm('/sign-in', { email, password: 'x-y-z' });
		expect(await viaMainApp.text()).toContain('Too many failed sign-ins');
	});

	it('answers 429 to an address that has guessed 30 wrong API tokens', async () => {
		const address = `${subnet()}.1`;
		const guesser = (n: number) =>
			fetch(new URL('/api/v1/me', app.origin), {
				headers: { authorization: `Bearer frt_guess${n}`, 'x-forwarded-for': address }
			});
		for (let i = 1; i <= 30; i++) expect((await guesser(i)).status).toBe(401);
		const locked = await guesser(31);
		expect(locked.status).toBe(429);
		expect(locked.headers.get('retry-after')).toMatch(/^\d+$/);
		expect((await locked.json()).error.code).toBe('too_many_requests');
	});
});
