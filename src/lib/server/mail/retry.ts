import { building } from '$app/environment';
import { mailSettings } from './config';
import { attemptDelivery, claim, dueMessageIds } from './outbox';

let timer: NodeJS.Timeout | null = null;
let running = false;

/**
 * Retries queued mail every MAIL_RETRY_INTERVAL_MS. Safe with several app processes: each row
 * is claimed with a conditional UPDATE before it is sent (outbox.ts `claim`).
 */
export function startMailRetryLoop(): void {
	if (building || timer) return;
	timer = setInterval(() => void retryDueMail(), mailSettings().MAIL_RETRY_INTERVAL_MS);
	timer.unref();
}

export function stopMailRetryLoop(): void {
	if (timer) clearInterval(timer);
	timer = null;
}

async function retryDueMail(): Promise<void> {
	if (running) return;
	running = true;
	try {
		for (const id of await dueMessageIds()) {
			if (await claim(id)) await attemptDelivery(id);
		}
	} catch (err) {
		// A database that is down is reported by /api/health; the next tick tries again.
		console.error('mail retry:', err instanceof Error ? err.message : err);
	} finally {
		running = false;
	}
}
