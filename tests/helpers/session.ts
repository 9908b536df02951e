import { appUrl } from './env';

/** The demo users (seeds/scenario.ts), by role; all share the demo password. */
export const DEMO_PASSWORD = 'cover-check-demo-2026';
export const DEMO_USERS = {
	admin: 'admin@kestrel-lane.example',
	engineer: 'engineer@kestrel-lane.example',
	surveyor: 'surveyor@kestrel-lane.example',
	owner: 'owner@northmoor.example',
	researcher: 'researcher@durability-collective.example'
} as const;
export type DemoRole = keyof typeof DEMO_USERS;

export interface HttpClient {
	/** `name=value` of the session cookie ('' for a token or anonymous client). */
	cookie: string;
	get(path: string, headers?: Record<string, string>): Promise<Response>;
	/** A form post as a browser sends it (Origin header set, redirects not followed). */
	postForm(path: string, fields?: Record<string, string>): Promise<Response>;
	postJson(path: string, body: unknown): Promise<Response>;
	/** A raw body (a file, as the upload routes take it), or none. */
	postBody(path: string, body?: BodyInit, contentType?: string): Promise<Response>;
	putJson(path: string, body: unknown): Promise<Response>;
	patchJson(path: string, body: unknown): Promise<Response>;
	delete(path: string): Promise<Response>;
}

/** A client that sends the given headers on every request and never follows redirects. */
export function httpClient(
	base: Record<string, string> = {},
	cookie = '',
	url = appUrl()
): HttpClient {
	const origin = new URL(url).origin;
	const send = (
		method: string,
		path: string,
		body?: BodyInit,
		headers: Record<string, string> = {}
	) =>
		fetch(new URL(path, url), {
			method,
			body,
			redirect: 'manual',
			headers: { ...base, ...(cookie ? { cookie } : {}), ...headers }
		});
	const sendJson = (method: string) => (path: string, body: unknown) =>
		send(method, path, JSON.stringify(body), { 'content-type': 'application/json', origin });
	return {
		cookie,
		get: (path, headers) => send('GET', path, undefined, { accept: acceptFor(path), ...headers }),
		// `accept: text/html` as a browser sends it; with fetch's `*/*` SvelteKit would answer a
		// form post as use:enhance's JSON instead of a 303.
		postForm: (path, fields = {}) =>
			send('POST', path, new URLSearchParams(fields), {
				'content-type': 'application/x-www-form-urlencoded',
				accept: 'text/html',
				origin
			}),
		postJson: sendJson('POST'),
		postBody: (path, body, contentType) =>
			send('POST', path, body, {
				origin,
				accept: 'application/json',
				...(contentType ? { 'content-type': contentType } : {})
			}),
		putJson: sendJson('PUT'),
		patchJson: sendJson('PATCH'),
		delete: (path) => send('DELETE', path, undefined, { origin })
	};
}

/** What a browser page asks for, or what a script calling /api asks for. */
function acceptFor(path: string): string {
	return path.startsWith('/api/') ? 'application/json' : 'text/html';
}

/** An anonymous client (nobody signed in). */
export function anonymousClient(url = appUrl()): HttpClient {
	return httpClient({}, '', url);
}

/** The `name=value` part of the session cookie a response sets, if any. */
export function sessionCookieFrom(response: Response): string | null {
	for (const header of response.headers.getSetCookie()) {
		const pair = header.split(';')[0];
		if (pair.startsWith('fractile_session=') && pair !== 'fractile_session=') return pair;
	}
	return null;
}

/** Signs in through the real sign-in form over HTTP; throws with the page's answer if refused. */
export async function signIn(
	email: string,
	password = DEMO_PASSWORD,
	url = appUrl()
): Promise<HttpClient> {
	const response = await anonymousClient(url).postForm('/sign-in', { email, password });
	const cookie = sessionCookieFrom(response);
	if (response.status !== 303 || !cookie) {
		throw new Error(
			`sign-in as ${email} failed (${response.status}): ${(await response.text()).slice(0, 300)}`
		);
	}
	return httpClient({}, cookie, url);
}

export function signInAs(role: DemoRole, url = appUrl()): Promise<HttpClient> {
	return signIn(DEMO_USERS[role], DEMO_PASSWORD, url);
}

/** A client that acts with `Authorization: Bearer <token>`. */
export function tokenClient(token: string, url = appUrl()): HttpClient {
	return httpClient({ authorization: `Bearer ${token}` }, '', url);
}
