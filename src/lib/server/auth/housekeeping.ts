import { building } from '$app/environment';
import { Op, QueryTypes } from 'sequelize';
import { db } from '../db';
import { SignInThrottle } from '../db/models';
import { deleteExpiredSessions } from './session';
import { FAILURE_WINDOW_SECONDS } from './throttleRules';

const EVERY_MS = 60 * 60 * 1000;
let timer: NodeJS.Timeout | null = null;

/**
 * Hourly: deletes expired sessions and throttle counters that no longer count. Harmless when
 * several processes do it at once (plain DELETEs of rows nobody needs).
 */
export function startAuthHousekeeping(): void {
	if (building || timer) return;
	timer = setInterval(() => void sweep(), EVERY_MS);
	timer.unref();
}

export function stopAuthHousekeeping(): void {
	if (timer) clearInterval(timer);
	timer = null;
}

async function sweep(): Promise<void> {
	try {
		await deleteExpiredSessions();
		const forgotten = new Date(Date.now() - FAILURE_WINDOW_SECONDS * 1000);
		await SignInThrottle.destroy({
			where: {
				updatedAt: { [Op.lt]: forgotten },
				[Op.or]: [{ lockedUntil: null }, { lockedUntil: { [Op.lt]: new Date() } }]
			}
		});
		// Rate counters of windows long over (no window is longer than a day); a caller's own
		// next hit clears its older rows, but one who never comes back (an address asked about
		// once) would otherwise stay.
		await db().query('DELETE FROM api_rate_counters WHERE window_start < NOW() - INTERVAL 2 DAY', {
			type: QueryTypes.DELETE
		});
	} catch (err) {
		console.error('auth housekeeping:', err instanceof Error ? err.message : err);
	}
}
