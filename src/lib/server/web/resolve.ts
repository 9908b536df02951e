import type { RequestEvent } from '@sveltejs/kit';
import { User } from '../db/models';
import {
	blankSessionCookie,
	SESSION_COOKIE,
	sessionCookie,
	validateSession
} from '../auth/session';
import { activeMembership, membershipIn } from '../auth/membership';
import { verifyApiToken } from '../auth/apiTokens';
import { lockedUntil, recordFailure } from '../auth/throttle';
import { clientAddress, setCookie } from './request';

/**
 * Works out who is asking and fills event.locals: a bearer token on /api routes, else the
 * session cookie. A bad or revoked token leaves the request anonymous (the route then answers
 * 401); it never falls back to the cookie, so a script cannot borrow a browser's session.
 */
export async function resolveAuth(event: RequestEvent): Promise<{ throttledUntil: Date | null }> {
	const bearer = readBearer(event);
	if (bearer === null) {
		await resolveSession(event);
	} else if (event.url.pathname.startsWith('/api/')) {
		return { throttledUntil: await resolveToken(event, bearer) };
	}
	return { throttledUntil: null };
}

function readBearer(event: RequestEvent): string | null {
	const header = event.request.headers.get('authorization');
	if (!header) return null;
	const match = /^Bearer\s+(\S+)$/i.exec(header.trim());
	return match ? match[1] : '';
}

/**
 * Guessing tokens is throttled per address like guessing passwords; returns the lock's end
 * when one is in force (the hook then answers 429). The token is looked up first: a valid token
 * (32 random bytes, nothing to guess) is accepted even from an address that is locked for wrong
 * tokens or failed sign-ins, so nobody sharing an address can lock a script out.
 */
async function resolveToken(event: RequestEvent, secret: string): Promise<Date | null> {
	const token = await verifyApiToken(secret);
	if (!token) {
		const key = { scope: 'token' as const, subject: clientAddress(event) };
		const until = await lockedUntil([key]);
		if (until) return until;
		await recordFailure([key]);
		return null;
	}
	const membership = await membershipIn(token.userId, token.organisationId);
	const user = await User.findByPk(token.userId);
	if (!membership || !user) return null;
	event.locals.user = { id: user.id, email: user.email, displayName: user.displayName };
	event.locals.membership = membership;
	event.locals.authMethod = 'token';
	return null;
}

async function resolveSession(event: RequestEvent): Promise<void> {
	const sessionId = event.cookies.get(SESSION_COOKIE);
	if (!sessionId) return;
	const valid = await validateSession(sessionId);
	if (!valid) {
		setCookie(event, blankSessionCookie());
		return;
	}
	const { session, user } = valid;
	// Sliding expiry: the session layer moved the expiry on; send the cookie again with the new date.
	if (session.fresh) setCookie(event, sessionCookie(session.id));
	const row = await User.findByPk(user.id, { attributes: ['activeOrganisationId'] });
	event.locals.user = { id: user.id, email: user.email, displayName: user.displayName };
	event.locals.session = { id: session.id, expiresAt: session.expiresAt, fresh: session.fresh };
	event.locals.membership = await activeMembership(user.id, row?.activeOrganisationId ?? null);
	event.locals.authMethod = 'session';
}
