import { QueryTypes } from 'sequelize';
import { z } from 'zod';
import { env } from '$env/dynamic/private';
import { db } from '../db';

/**
 * Rate limits of /api/v1: a fixed window per caller (the token's or session's user, else the
 * client address), counted in MariaDB (table api_rate_counters) so every app process shares
 * the count. Over the limit: 429 with Retry-After (seconds to the next window).
 */
const settingsSchema = z.object({
	API_RATE_LIMIT: z.coerce.number().int().min(1).max(1_000_000).default(300),
	API_RATE_WINDOW_SECONDS: z.coerce.number().int().min(1).max(86_400).default(60)
});

export function rateLimitSettings() {
	const parsed = settingsSchema.safeParse(env);
	if (!parsed.success) {
		const issue = parsed.error.issues[0];
		throw new Error(`API rate-limit settings: ${issue.path.join('.')}: ${issue.message}`);
	}
	return parsed.data;
}

export interface RateDecision {
	limit: number;
	remaining: number;
	retryAfterSeconds: number;
	allowed: boolean;
}

/** Counts one request of `caller` against the API's limit and says whether it is within it. */
export async function countRequest(caller: string): Promise<RateDecision> {
	const { API_RATE_LIMIT: limit, API_RATE_WINDOW_SECONDS: windowSeconds } = rateLimitSettings();
	return countInWindow(caller, limit, windowSeconds);
}

/**
 * Counts one hit of `caller` in the current fixed window of `windowSeconds` (table
 * api_rate_counters, shared by every app process) and says whether it is within `limit`. The
 * one counter behind the API's rate limit and the password-reset throttle; `caller` must stay
 * under 100 characters.
 */
export async function countInWindow(
	caller: string,
	limit: number,
	windowSeconds: number
): Promise<RateDecision> {
	const nowSeconds = Math.floor(Date.now() / 1000);
	const windowStart = nowSeconds - (nowSeconds % windowSeconds);
	// The window length is part of the bucket, so processes set up differently never share a row.
	const bucket = `${caller}/w${windowSeconds}`;
	const sequelize = db();
	await sequelize.query(
		`INSERT INTO api_rate_counters (bucket, window_start, hits) VALUES (:bucket, FROM_UNIXTIME(:windowStart), 1)
		 ON DUPLICATE KEY UPDATE hits = hits + 1`,
		{ type: QueryTypes.INSERT, replacements: { bucket, windowStart } }
	);
	const row = await sequelize.query<{ hits: number }>(
		'SELECT hits FROM api_rate_counters WHERE bucket = :bucket AND window_start = FROM_UNIXTIME(:windowStart)',
		{ type: QueryTypes.SELECT, plain: true, replacements: { bucket, windowStart } }
	);
	const hits = Number(row?.hits ?? 1);
	if (hits === 1) {
		// First request of a new window: this caller's older windows are of no further use.
		await sequelize.query(
			'DELETE FROM api_rate_counters WHERE bucket = :bucket AND window_start < FROM_UNIXTIME(:windowStart)',
			{ type: QueryTypes.DELETE, replacements: { bucket, windowStart } }
		);
	}
	return {
		limit,
		remaining: Math.max(0, limit - hits),
		retryAfterSeconds: windowStart + windowSeconds - nowSeconds,
		allowed: hits <= limit
	};
}
