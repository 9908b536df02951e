import type { Handle, HandleServerError } from '@sveltejs/kit';
import { randomUUID } from 'node:crypto';
import { closeDb, db } from '$lib/server/db';
import { databaseUnavailableResponse, isDatabaseUnavailable } from '$lib/server/db/unavailable';
import { resolveAuth } from '$lib/server/auth/resolve';
import { toApiErrorResponse } from '$lib/server/http';
import { startMailRetryLoop, stopMailRetryLoop } from '$lib/server/mail/retry';

const SECURITY_HEADERS: Record<string, string> = {
	'x-content-type-options': 'nosniff',
	'referrer-policy': 'strict-origin-when-cross-origin',
	'x-frame-options': 'DENY',
	'permissions-policy': 'camera=(), microphone=(), geolocation=()',
	'cross-origin-opener-policy': 'same-origin'
};

// Bind the models to the one Sequelize instance before the first request, whatever route it
// asks for (connecting waits for the first query).
db();
startMailRetryLoop();

export const handle: Handle = async ({ event, resolve }) => {
	event.locals.requestId = randomUUID();
	event.locals.user = null;
	event.locals.session = null;
	event.locals.membership = null;
	event.locals.authMethod = null;
	try {
		await resolveAuth(event);
	} catch (err) {
		if (isDatabaseUnavailable(err)) return databaseUnavailableResponse(event.url.pathname);
		throw err;
	}
	let response = await resolve(event);
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
	void closeDb();
});
