import { json, type Handle, type HandleServerError, type ServerInit } from '@sveltejs/kit';
import { randomUUID } from 'node:crypto';
import { closeDb, db } from '$lib/server/db';
import { closeStorage } from '$lib/server/storage/s3';
import { databaseUnavailableResponse, isDatabaseUnavailable } from '$lib/server/db/unavailable';
import { resolveAuth } from '$lib/server/web/resolve';
import { toApiErrorResponse } from '$lib/server/web/http';
import { limitApiRate } from '$lib/server/web/apiRate';
import { lockedMessage, retryAfterSeconds } from '$lib/server/auth/throttleRules';
import { startAuthHousekeeping, stopAuthHousekeeping } from '$lib/server/auth/housekeeping';
import { startMailRetryLoop, stopMailRetryLoop } from '$lib/server/mail/retry';
import { failAbandonedImportsAtStart } from '$lib/server/import/abandoned';
import {
	startStagingHousekeeping,
	stopStagingHousekeeping
} from '$lib/server/import/stagingHousekeeping';

const SECURITY_HEADERS: Record<string, string> = {
	'x-content-type-options': 'nosniff',
	'referrer-policy': 'strict-origin-when-cross-origin',
	'x-frame-options': 'DENY',
	'permissions-policy': 'camera=(), microphone=(), geolocation=()',
	'cross-origin-opener-policy': 'same-origin'
};

/**
 * Once per process, before the first request: bind the models to the one Sequelize instance
 * (model calls made before `db()` would fail), start the mail retry loop and the hourly sweep
 * of expired sessions and stale throttle counters, fail the imports a process that was
 * killed or crashed left running (this one, if it is a restart), and clear this machine's
 * staging folder of uploads left over.
 */
export const init: ServerInit = () => {
	db();
	startMailRetryLoop();
	startAuthHousekeeping();
	failAbandonedImportsAtStart();
	startStagingHousekeeping();
};

export const handle: Handle = async ({ event, resolve }) => {
	event.locals.requestId = randomUUID();
	event.locals.user = null;
	event.locals.session = null;
	event.locals.membership = null;
	event.locals.authMethod = null;
	let throttledUntil: Date | null;
	let limited: Response | null = null;
	try {
		({ throttledUntil } = await resolveAuth(event));
		// Counted after sign-in is resolved, so a token holder's requests share one count.
		if (!throttledUntil) limited = await limitApiRate(event);
	} catch (err) {
		if (isDatabaseUnavailable(err)) return databaseUnavailableResponse(event.url.pathname);
		throw err;
	}
	let response = throttledUntil
		? tooManyTokenGuesses(throttledUntil)
		: (limited ?? (await resolve(event)));
	// A load or action met a database that is down (handleError marked it): say so plainly.
	if (event.locals.databaseUnavailable) return databaseUnavailableResponse(event.url.pathname);
	// Every failed /api answer leaves in one shape, { error: { code, message, field? } } (http.ts).
	if (event.url.pathname.startsWith('/api/')) response = await toApiErrorResponse(response);
	for (const [name, value] of Object.entries(SECURITY_HEADERS)) {
		if (!response.headers.has(name)) response.headers.set(name, value);
	}
	// Signed-in pages differ per person: no shared cache may keep them.
	if (event.locals.user && !response.headers.has('cache-control')) {
		response.headers.set('cache-control', 'private, no-store');
	}
	return response;
};

function tooManyTokenGuesses(until: Date): Response {
	return json(
		{
			error: {
				code: 'too_many_requests',
				message: lockedMessage(until).replace('sign-ins', 'token attempts')
			}
		},
		{ status: 429, headers: { 'retry-after': String(retryAfterSeconds(until)) } }
	);
}

/** Unexpected errors: logged with an id, shown without internals (no SQL or stack). */
export const handleError: HandleServerError = ({ error, event, status, message }) => {
	const errorId = event.locals.requestId ?? randomUUID();
	if (isDatabaseUnavailable(error)) {
		event.locals.databaseUnavailable = true;
		console.warn(
			`[${errorId}] ${event.request.method} ${event.url.pathname}: database unavailable`
		);
		return { message: 'Fractile cannot reach its database right now.', errorId };
	}
	if (status >= 500) {
		console.error(`[${errorId}] ${event.request.method} ${event.url.pathname}:`, error);
	}
	return { message: status >= 500 ? 'Something went wrong on our side.' : message, errorId };
};

// adapter-node emits this on SIGTERM/SIGINT; closing the pool lets the process end promptly.
process.on('sveltekit:shutdown', () => {
	stopMailRetryLoop();
	stopAuthHousekeeping();
	stopStagingHousekeeping();
	closeStorage();
	void closeDb();
	// adapter-node has already drained the HTTP server; a socket a library keeps open (an SDK's
	// keep-alive agent, a driver's timer) must not keep the process from ending, so exit after a
	// short grace period whatever is left.
	setTimeout(() => process.exit(0), 2_000).unref();
});
