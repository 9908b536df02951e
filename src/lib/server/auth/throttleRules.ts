/**
 * Sign-in throttling rules, pure so they can be tested without a database.
 * Per account *from one address* ('account' scope, subject `accountSubject`): the first 5
 * failures cost nothing; each one after that locks that account for that address only, for a
 * delay that doubles (30 s, 1 min, 2 min ...) up to 15 minutes. Per address across accounts the
 * same, with more free failures, since one office can share one address. There is no lock of an
 * account from everywhere: a stranger who knows an e-mail address would keep its owner out for
 * as long as they liked. Guessing from many addresses is slowed by each address's own delay and
 * made hopeless by the password rules (zxcvbn score 3: over 10^8 guesses).
 * Failures older than the window are forgotten.
 */
export type ThrottleScope = 'account' | 'address' | 'token';

export const FREE_FAILURES: Record<ThrottleScope, number> = { account: 5, address: 20, token: 30 };
export const FIRST_DELAY_SECONDS = 30;
export const MAX_DELAY_SECONDS = 15 * 60;
/** A quiet spell this long starts the count again. */
export const FAILURE_WINDOW_SECONDS = 60 * 60;

/** Seconds of lock after this many consecutive failures (0 while still free). */
export function lockSeconds(scope: ThrottleScope, failures: number): number {
	const beyond = failures - FREE_FAILURES[scope];
	if (beyond < 0) return 0;
	return Math.min(MAX_DELAY_SECONDS, FIRST_DELAY_SECONDS * 2 ** Math.min(beyond, 20));
}

/** Whole seconds until `until` (at least 1): the Retry-After of a lock. */
export function retryAfterSeconds(until: Date, now = new Date()): number {
	return Math.max(1, Math.ceil((until.getTime() - now.getTime()) / 1000));
}

/** "45 seconds", "3 minutes". */
export function waitInWords(seconds: number): string {
	return seconds < 90 ? `${seconds} seconds` : `${Math.ceil(seconds / 60)} minutes`;
}

/** The words shown when a lock is in force; the same whether or not the account exists. */
export function lockedMessage(until: Date, now = new Date()): string {
	const wait = waitInWords(retryAfterSeconds(until, now));
	return `Too many failed sign-ins. Try again in ${wait} (after ${until.toISOString().slice(11, 19)} UTC).`;
}
