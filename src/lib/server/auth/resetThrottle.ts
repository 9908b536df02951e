import { createHash } from 'node:crypto';
import { z } from 'zod';
import { env } from '$env/dynamic/private';
import { countInWindow } from '../api/rateLimit';

/**
 * How often a new password may be asked for: per client address (one address mailing many
 * accounts) and per e-mail address (one account flooded with mail). Both counts are kept for
 * every address asked about, known or not, so the answer reveals nothing about accounts.
 */
const settingsSchema = z.object({
	RESET_LIMIT_PER_ADDRESS: z.coerce.number().int().min(1).max(1_000_000).default(10),
	RESET_LIMIT_PER_ACCOUNT: z.coerce.number().int().min(1).max(1_000).default(3),
	RESET_WINDOW_SECONDS: z.coerce
		.number()
		.int()
		.min(60)
		.max(86_400)
		.default(15 * 60)
});

function resetThrottleSettings() {
	const parsed = settingsSchema.safeParse(env);
	if (!parsed.success) {
		const issue = parsed.error.issues[0];
		throw new Error(`Password-reset limits: ${issue.path.join('.')}: ${issue.message}`);
	}
	return parsed.data;
}

/** Counts one request; the seconds to wait when either count is over its limit, else null. */
export async function resetRequestWait(email: string, address: string): Promise<number | null> {
	const settings = resetThrottleSettings();
	const window = settings.RESET_WINDOW_SECONDS;
	// A hash, so the counter table holds no e-mail address and every bucket has one length.
	const account = createHash('sha256').update(email, 'utf8').digest('hex').slice(0, 40);
	const byAddress = await countInWindow(
		`reset:ip:${address}`,
		settings.RESET_LIMIT_PER_ADDRESS,
		window
	);
	const byAccount = await countInWindow(
		`reset:to:${account}`,
		settings.RESET_LIMIT_PER_ACCOUNT,
		window
	);
	if (byAddress.allowed && byAccount.allowed) return null;
	return Math.max(
		byAddress.allowed ? 0 : byAddress.retryAfterSeconds,
		byAccount.allowed ? 0 : byAccount.retryAfterSeconds
	);
}
