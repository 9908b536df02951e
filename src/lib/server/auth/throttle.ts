import { QueryTypes } from 'sequelize';
import { db } from '../db';
import { SignInThrottle } from '../db/models';
import { FAILURE_WINDOW_SECONDS, lockSeconds, type ThrottleScope } from './throttle-rules';

export interface ThrottleKey {
	scope: ThrottleScope;
	subject: string;
}

/** The latest lock in force for any of the keys, or null. Counters live in MariaDB (issue 9). */
export async function lockedUntil(keys: ThrottleKey[]): Promise<Date | null> {
	let latest: Date | null = null;
	for (const key of keys) {
		const row = await SignInThrottle.findOne({ where: { scope: key.scope, subject: key.subject } });
		const until = row?.lockedUntil;
		if (until && until.getTime() > Date.now() && (!latest || until > latest)) latest = until;
	}
	return latest;
}

/**
 * Counts one failure against each key, atomically (INSERT ... ON DUPLICATE KEY UPDATE, so two
 * app processes cannot lose a count), and sets the lock the new count earns.
 */
export async function recordFailure(keys: ThrottleKey[]): Promise<void> {
	for (const key of keys) {
		await db().query(
			`INSERT INTO sign_in_throttles (scope, subject, failures, created_at, updated_at)
			 VALUES (:scope, :subject, 1, NOW(3), NOW(3))
			 ON DUPLICATE KEY UPDATE
			   failures = IF(updated_at < NOW(3) - INTERVAL :window SECOND, 1, failures + 1),
			   updated_at = NOW(3)`,
			{
				type: QueryTypes.INSERT,
				replacements: { ...key, window: FAILURE_WINDOW_SECONDS }
			}
		);
		const row = await SignInThrottle.findOne({ where: { scope: key.scope, subject: key.subject } });
		const seconds = row ? lockSeconds(key.scope, row.failures) : 0;
		if (row && seconds > 0) {
			await row.update({ lockedUntil: new Date(Date.now() + seconds * 1000) });
		}
	}
}

/** A successful sign-in clears the account's count (not the address's: an attacker's own
 * account must not wash out the count of the addresses they guess from). */
export async function clearFailures(key: ThrottleKey): Promise<void> {
	await SignInThrottle.destroy({ where: { scope: key.scope, subject: key.subject } });
}
