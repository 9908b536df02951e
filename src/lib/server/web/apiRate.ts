import { json, type RequestEvent } from '@sveltejs/kit';
import { countRequest, rateLimitSettings } from '../api/rateLimit';

/** The API's rate limit at the door: who is calling, counted by api/rateLimit.ts. */
function callerOf(event: RequestEvent): string {
	if (event.locals.user) return `user:${event.locals.user.id}`;
	let address = 'unknown';
	try {
		address = event.getClientAddress();
	} catch {
		// No address from the adapter (tests through `vite dev`): one shared anonymous bucket.
	}
	return `ip:${address}`;
}

/** For hooks.server.ts: null when the request may go on, else the 429 answer. */
export async function limitApiRate(event: RequestEvent): Promise<Response | null> {
	if (!event.url.pathname.startsWith('/api/v1/')) return null;
	const decision = await countRequest(callerOf(event));
	event.setHeaders({
		'ratelimit-limit': String(decision.limit),
		'ratelimit-remaining': String(decision.remaining)
	});
	if (decision.allowed) return null;
	return json(
		{
			error: {
				code: 'too_many_requests',
				message: `Too many requests: at most ${decision.limit} in ${rateLimitSettings().API_RATE_WINDOW_SECONDS} s. Try again in ${decision.retryAfterSeconds} s.`
			}
		},
		{ status: 429, headers: { 'retry-after': String(decision.retryAfterSeconds) } }
	);
}
