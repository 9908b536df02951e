import type { RequestEvent } from '@sveltejs/kit';
import type { Cookie } from 'lucia';
import { User } from '../db/models';
import { lucia } from './lucia';
import { activeMembership, membershipIn } from './membership';
import { verifyApiToken } from './api-tokens';

/**
 * Works out who is asking and fills event.locals: a bearer token on /api routes, else the
 * session cookie. A bad or revoked token leaves the request anonymous (the route then answers
 * 401); it never falls back to the cookie, so a script cannot borrow a browser's session.
 */
export async function resolveAuth(event: RequestEvent): Promise<void> {
	const bearer = readBearer(event);
	if (bearer !== null) {
		if (event.url.pathname.startsWith('/api/')) await resolveToken(event, bearer);
		return;
	}
	await resolveSession(event);
}

function readBearer(event: RequestEvent): string | null {
	const header = event.request.headers.get('authorization');
	if (!header) return null;
	const match = /^Bearer\s+(\S+)$/i.exec(header.trim());
	return match ? match[1] : '';
}

async function resolveToken(event: RequestEvent, secret: string): Promise<void> {
	const token = await verifyApiToken(secret);
	if (!token) return;
	const membership = await membershipIn(token.userId, token.organisationId);
	const user = await User.findByPk(token.userId);
	if (!membership || !user) return;
	event.locals.user = { id: user.id, email: user.email, displayName: user.displayName };
	event.locals.membership = membership;
	event.locals.authMethod = 'token';
}

async function resolveSession(event: RequestEvent): Promise<void> {
	const auth = lucia();
	const sessionId = event.cookies.get(auth.sessionCookieName);
	if (!sessionId) return;
	const { session, user } = await auth.validateSession(sessionId);
	if (!session) {
		setCookie(event, auth.createBlankSessionCookie());
		return;
	}
	// Sliding expiry: lucia moved the expiry on; send the cookie again with the new date.
	if (session.fresh) setCookie(event, auth.createSessionCookie(session.id));
	const row = await User.findByPk(user.id, { attributes: ['activeOrganisationId'] });
	event.locals.user = { id: user.id, email: user.email, displayName: user.displayName };
	event.locals.session = { id: session.id, expiresAt: session.expiresAt, fresh: session.fresh };
	event.locals.membership = await activeMembership(user.id, row?.activeOrganisationId ?? null);
	event.locals.authMethod = 'session';
}

export function setCookie(event: Pick<RequestEvent, 'cookies'>, cookie: Cookie): void {
	event.cookies.set(cookie.name, cookie.value, { path: '/', ...cookie.attributes });
}
