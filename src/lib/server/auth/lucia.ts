import { Lucia, TimeSpan } from 'lucia';
import { env } from '$env/dynamic/private';
import { SequelizeSessionAdapter } from './adapter';

/** Thirty days, sliding: lucia extends a session once half of it has passed. */
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
export function lucia() {
	instance ??= createLucia();
	return instance;
}

declare module 'lucia' {
	interface Register {
		Lucia: ReturnType<typeof createLucia>;
		UserId: number;
		DatabaseUserAttributes: { email: string; displayName: string };
		DatabaseSessionAttributes: { userAgent: string | null; ipAddress: string | null };
	}
}
