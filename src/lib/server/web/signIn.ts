import type { RequestEvent } from '@sveltejs/kit';
import { User } from '../db/models';
import { recordAudit } from '../audit';
import { hashPassword, verifyPassword } from '../auth/password';
import {
	blankSessionCookie,
	createSession,
	invalidateSession,
	invalidateUserSessions
} from '../auth/session';
import { clientAddress, setCookie } from './request';
import {
	accountKey,
	clearFailures,
	lockedUntil,
	recordFailure,
	type ThrottleKey
} from '../auth/throttle';
import { lockedMessage, retryAfterSeconds } from '../auth/throttleRules';

export { clientAddress };

/** One message for an unknown address and a wrong password, so neither can be told apart. */
export const SIGN_IN_REFUSED = 'That e-mail address and password do not match an account.';

export type SignInOutcome =
	{ ok: true; user: User } | { ok: false; message: string; retryAfterSeconds?: number };

let dummyHash: Promise<string> | null = null;

/**
 * Checks a password with throttling per account and per address. For an unknown address we
 * still verify against a dummy hash, so the answer takes as long as for a real account.
 */
export async function attemptSignIn(
	email: string,
	password: string,
	address: string
): Promise<SignInOutcome> {
	const keys: ThrottleKey[] = [accountKey(email, address), { scope: 'address', subject: address }];
	const until = await lockedUntil(keys);
	if (until) {
		return {
			ok: false,
			message: lockedMessage(until),
			retryAfterSeconds: retryAfterSeconds(until)
		};
	}
	const user = await User.findOne({ where: { email } });
	dummyHash ??= hashPassword('no account has this password');
	const matches = await verifyPassword(user?.passwordHash ?? (await dummyHash), password);
	if (!user || !user.passwordHash || !matches) {
		await recordFailure(keys);
		await recordAudit({
			action: 'auth.sign_in_failed',
			userId: user?.id,
			// So the account's organisation sees attempts on it in its audit log.
			organisationId: user?.activeOrganisationId,
			ipAddress: address,
			detail: { email }
		});
		return { ok: false, message: SIGN_IN_REFUSED };
	}
	await clearFailures(keys[0]);
	await recordAudit({
		action: 'auth.sign_in',
		userId: user.id,
		organisationId: user.activeOrganisationId,
		ipAddress: address
	});
	return { ok: true, user };
}

/** Starts a session for the user on this device and sets its cookie. */
export async function startSession(event: RequestEvent, userId: number): Promise<void> {
	const cookie = await createSession(userId, {
		userAgent: (event.request.headers.get('user-agent') ?? '').slice(0, 255) || null,
		ipAddress: clientAddress(event)
	});
	setCookie(event, cookie);
}

/** Ends this device's session (or all of the user's) and clears the cookie. */
export async function endSessions(event: RequestEvent, everywhere: boolean): Promise<void> {
	if (everywhere && event.locals.user) await invalidateUserSessions(event.locals.user.id);
	else if (event.locals.session) await invalidateSession(event.locals.session.id);
	setCookie(event, blankSessionCookie());
}
