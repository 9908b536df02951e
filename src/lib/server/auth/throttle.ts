import { createHash } from 'node:crypto';
import { Op, QueryTypes, type Transaction } from 'sequelize';
import { db } from '../db';
import { SignInThrottle } from '../db/models';
import { FAILURE_WINDOW_SECONDS, lockSeconds, type ThrottleScope } from './throttleRules';

export interface ThrottleKey {
	scope: ThrottleScope;
	subject: string;
}

/** The part of an 'account' subject that names the account: a hash, so that it has one length. */
function accountPart(email: string): string {
	return createHash('sha256').update(email.toLowerCase(), 'utf8').digest('hex').slice(0, 32);
}

/**
 * The 'account' key is an account as tried from one address (throttleRules.ts): failures from
 * a stranger's address lock that address out of the account, never its owner elsewhere.
 */
export function accountKey(email: string, address: string): ThrottleKey {
	return { scope: 'account', subject: `${accountPart(email)}@${address}`.slice(0, 254) };
}

/** Forgets every address's failures on an account (its password was just reset). */
export async function clearAccountFailures(email: string, transaction?: Transaction) {
	await SignInThrottle.destroy({
		where: { scope: 'account', subject: { [Op.like]: `${accountPart(email)}@%` } },
		transaction
	});
}

/** The latest lock in force for any of the keys, or null. Counters live in MariaDB, shared by every app process. */
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

/** A successful sign-in clears the account's count from that address (not the address's own:
 * an attacker's own account must not wash out the count of the addresses they guess from). */
export async function clearFailures(key: ThrottleKey): Promise<void> {
	await SignInThrottle.destroy({ where: { scope: key.scope, subject: key.subject } });
}
