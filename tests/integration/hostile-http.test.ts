/**
 * Hostile requests: cross-site form posts, oversized and malformed bodies, path traversal in
 * download routes, session fixation. Covered elsewhere and not repeated here: brute force on
 * sign-in and on API tokens (throttling.test.ts), a signed-out cookie refused on pages, actions
 * and the API (auth-sessions.test.ts, "refuses the cookie afterwards").
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startBuiltApp } from '../helpers/server';
import { formActionPaths, jsonBodyRoutes } from '../helpers/actions';
import {
	anonymousClient,
	DEMO_PASSWORD,
	DEMO_USERS,
	httpClient,
	sessionCookieFrom,
	signInAs,
	type HttpClient
} from '../helpers/session';
import { appUrl } from '../helpers/env';

let admin: HttpClient;
beforeAll(async () => {
	admin = await signInAs('admin');
});

/** A post as a stranger's page would send it: our cookie, their Origin. */
function crossSite(path: string, body: string, contentType: string) {
	return fetch(new URL(path, appUrl()), {
		method: 'POST',
		body,
		redirect: 'manual',
		headers: {
			cookie: admin.cookie,
			origin: 'https://attacker.example',
			'content-type': contentType,
			accept: 'text/html'
		}
	});
}

describe('CSRF', () => {
	const actions = formActionPaths();

	it('finds the form actions in src/routes', () => {
		expect(actions.length).toBeGreaterThanOrEqual(15);
		expect(actions).toContain('/account/tokens?/create');
	});

	it.each(actions)('a cross-site form post to %s is refused 403', async (path) => {
		const response = await crossSite(
			path,
			'name=x&email=x%40x.example',
			'application/x-www-form-urlencoded'
		);
		expect(response.status).toBe(403);
		expect(await response.text()).toMatch(/Cross-site .* forbidden/);
	});

	it('a cross-site text/plain or multipart post to the API is refused too', async () => {
		for (const type of ['text/plain', 'multipart/form-data; boundary=x']) {
			const response = await crossSite('/api/v1/tokens', '{"name":"stolen"}', type);
			expect(response.status, type).toBe(403);
		}
		const tokens = (await (await admin.get('/api/v1/tokens')).json()).tokens as { name: string }[];
		expect(tokens.map((t) => t.name)).not.toContain('stolen');
	});
});

describe('oversized bodies', () => {
	// A copy of the app with a small body limit, so the test sends kilobytes, not 64 MB.
	let small: Awaited<ReturnType<typeof startBuiltApp>>;
	beforeAll(async () => {
		small = await startBuiltApp({ BODY_SIZE_LIMIT: '64K' });
	});
	afterAll(async () => {
		await small?.stop();
	});

	it('a JSON body over the limit is answered 413, with or without a length, and the app lives on', async () => {
		const client = await signInAs('engineer', small.origin);
		const big = JSON.stringify({ name: 'x'.repeat(200_000) });
		const declared = await client.postJson('/api/v1/tokens', { name: 'x'.repeat(200_000) });
		expect(declared.status).toBe(413);
		const streamed = await fetch(new URL('/api/v1/tokens', small.origin), {
			method: 'POST',
			// A stream has no Content-Length: the limit must hold while reading, too.
			body: new Blob([big]).stream(),
			duplex: 'half',
			headers: { cookie: client.cookie, 'content-type': 'application/json', origin: small.origin }
		} as RequestInit);
		expect([400, 413]).toContain(streamed.status);
		expect((await fetch(new URL('/api/health', small.origin))).status).toBe(200);
	});

	it('a form over the limit is answered 413, not a crash', async () => {
		const response = await anonymousClient(small.origin).postForm('/sign-in', {
			email: 'a@b.example',
			password: 'p'.repeat(200_000)
		});
		expect(response.status).toBe(413);
		expect(small.output()).not.toMatch(/uncaught|ERR_/i);
	});
});

describe('malformed JSON', () => {
	const bodies = jsonBodyRoutes();
	it('finds the JSON routes in src/routes', () => {
		expect(bodies.map(([p, m]) => `${m} ${p}`)).toContain('POST /api/v1/tokens');
	});
	it.each(bodies)('%s (%s) answers 400 invalid_json', async (path, method) => {
		for (const text of ['{"name":', "{'name': 'x'}", '\u0000', '']) {
			const response = await fetch(new URL(path, appUrl()), {
				method,
				body: text,
				headers: {
					cookie: admin.cookie,
					'content-type': 'application/json',
					origin: new URL(appUrl()).origin
				}
			});
			expect(response.status, `${path} ${JSON.stringify(text)}`).toBe(400);
			expect((await response.json()).error.code).toBe('invalid_json');
		}
	});
});

describe('path traversal in download routes', () => {
	const attempts = [
		'/api/v1/assessments/..%2f..%2fpackage.json/report',
		'/api/v1/assessments/1%2f..%2f..%2f.env.test/report',
		'/api/v1/assessments/%2e%2e%2f%2e%2e%2fetc%2fpasswd/report',
		'/r/..%2f..%2f.env.test/report.pdf',
		'/r/%2e%2e%2f%2e%2e%2fetc%2fpasswd/report.pdf',
		'/r/..%5c..%5cpackage.json/report.pdf',
		'/..%2f..%2fpackage.json',
		'/_app/..%2f..%2f.env.test',
		'/_app/immutable/..%2f..%2f..%2fpackage.json',
		'/%2e%2e/%2e%2e/etc/passwd'
	];
	it.each(attempts)('%s opens nothing outside', async (path) => {
		const response = await admin.get(path, { accept: '*/*' });
		expect([400, 404]).toContain(response.status);
		const text = await response.text();
		expect(text).not.toMatch(/root:x:0|"name": "fractile"|DB_PASSWORD|SESSION_SECRET/);
	});
});

describe('sign-in redirects', () => {
	it.each([
		'//attacker.example/x',
		'https://attacker.example',
		'/\\attacker.example',
		'%2F%2Fattacker.example'
	])('?next=%s lands on a path of our own', async (next) => {
		const response = await anonymousClient().postForm(`/sign-in?next=${encodeURIComponent(next)}`, {
			email: DEMO_USERS.researcher,
			password: DEMO_PASSWORD
		});
		expect(response.status).toBe(303);
		const location = response.headers.get('location') ?? '';
		expect(location).toMatch(/^\/(?![/\\])/);
		expect(new URL(location, appUrl()).origin).toBe(new URL(appUrl()).origin);
	});
});

describe('session fixation', () => {
	it('a cookie value set before sign-in is not adopted: sign-in issues a new one', async () => {
		const planted = 'fractile_session=planted0000000000000000000000000000';
		const response = await httpClient({ cookie: planted }).postForm('/sign-in', {
			email: DEMO_USERS.engineer,
			password: DEMO_PASSWORD
		});
		expect(response.status).toBe(303);
		const issued = sessionCookieFrom(response);
		expect(issued).toBeTruthy();
		expect(issued).not.toBe(planted);
		expect((await httpClient({}, planted).get('/api/v1/me')).status).toBe(401);
		expect((await httpClient({}, issued!).get('/api/v1/me')).status).toBe(200);
	});

	it('signing in again while signed in gives a fresh session id', async () => {
		const first = await signInAs('surveyor');
		const again = await httpClient({}, first.cookie).postForm('/sign-in', {
			email: DEMO_USERS.surveyor,
			password: DEMO_PASSWORD
		});
		const second = sessionCookieFrom(again);
		expect(again.status).toBe(303);
		expect(second).toBeTruthy();
		expect(second).not.toBe(first.cookie);
	});
});
