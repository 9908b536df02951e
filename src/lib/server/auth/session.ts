import { Lucia, TimeSpan } from 'lucia';
import { env } from '$env/dynamic/private';
import { SequelizeSessionAdapter } from './adapter';

/*
 * Sessions: the one file that knows lucia. lucia is deprecated upstream, so nothing else imports
 * it (an ESLint rule holds that): the route layer and the housekeeping call the functions below,
 * which speak our own types, and the storage in adapter.ts is lucia-free. Replacing lucia means
 * rewriting this file alone.
 */

/** A cookie to set, in the shape SvelteKit's cookies.set takes apart. */
export interface SessionCookie {
	name: string;
	value: string;
	attributes: {
		secure?: boolean;
		path?: string;
		domain?: string;
		sameSite?: 'lax' | 'strict' | 'none';
		httpOnly?: boolean;
		maxAge?: number;
		expires?: Date;
	};
}

/** A session that is still valid, and whose it is. `fresh`: its expiry has just moved on. */
export interface ValidSession {
	session: { id: string; expiresAt: Date; fresh: boolean };
	user: { id: number; email: string; displayName: string };
}

/** Thirty days, sliding: a session is extended once half of it has passed. */
const SESSION_LIFETIME = new TimeSpan(30, 'd');

export const SESSION_COOKIE = 'fractile_session';

function createLucia() {
	return new Lucia(new SequelizeSessionAdapter(), {
		sessionExpiresIn: SESSION_LIFETIME,
		sessionCookie: {
			name: SESSION_COOKIE,
			// lucia always sets httpOnly; secure only when we are served over https, so the
			// cookie still works on http://127.0.0.1 in development and tests.
			attributes: { sameSite: 'lax', secure: (env.ORIGIN ?? '').startsWith('https://') }
		},
		getUserAttributes: (attributes) => ({
			email: attributes.email,
			displayName: attributes.displayName
		})
	});
}

let instance: ReturnType<typeof createLucia> | null = null;

/** The one lucia instance, made on first use (the environment is read at runtime). */
function lucia() {
	instance ??= createLucia();
	return instance;
}

/** The session a cookie's value names, or null when it is unknown or has expired. */
export async function validateSession(cookieValue: string): Promise<ValidSession | null> {
	const { session, user } = await lucia().validateSession(cookieValue);
	if (!session) return null;
	return {
		session: { id: session.id, expiresAt: session.expiresAt, fresh: session.fresh },
		user: { id: user.id, email: user.email, displayName: user.displayName }
	};
}

/** Starts a session for a user on a device; answers the cookie that carries it. */
export async function createSession(
	userId: number,
	device: { userAgent: string | null; ipAddress: string | null }
): Promise<SessionCookie> {
	const session = await lucia().createSession(userId, device);
	return lucia().createSessionCookie(session.id);
}

/** The cookie for a session again, with its moved-on expiry. */
export const sessionCookie = (sessionId: string): SessionCookie =>
	lucia().createSessionCookie(sessionId);

/** The cookie that clears the session cookie in the browser. */
export const blankSessionCookie = (): SessionCookie => lucia().createBlankSessionCookie();

export const invalidateSession = (sessionId: string): Promise<void> =>
	lucia().invalidateSession(sessionId);

export const invalidateUserSessions = (userId: number): Promise<void> =>
	lucia().invalidateUserSessions(userId);

export const deleteExpiredSessions = (): Promise<void> => lucia().deleteExpiredSessions();

declare module 'lucia' {
	interface Register {
		Lucia: ReturnType<typeof createLucia>;
		UserId: number;
		DatabaseUserAttributes: { email: string; displayName: string };
		DatabaseSessionAttributes: { userAgent: string | null; ipAddress: string | null };
	}
}
