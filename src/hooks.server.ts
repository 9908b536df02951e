import type { Handle, HandleServerError } from '@sveltejs/kit';
import { randomUUID } from 'node:crypto';
import { closeDb, db } from '$lib/server/db';
import { resolveAuth } from '$lib/server/auth/resolve';
import { toApiErrorResponse } from '$lib/server/http';
import { limitApiRate } from '$lib/server/api/rateLimit';
import { startMailRetryLoop, stopMailRetryLoop } from '$lib/server/mail/retry';

const SECURITY_HEADERS: Record<string, string> = {
	'x-content-type-options': 'nosniff',
	'referrer-policy': 'strict-origin-when-cross-origin',
	'x-frame-options': 'DENY',
	'permissions-policy': 'camera=(), microphone=(), geolocation=()',
	'cross-origin-opener-policy': 'same-origin'
};

// Bind the models at start-up (no connection is made yet): code that uses a model before
// anything has called db() — the first request after a restart being a sign-in — would
// otherwise find it unbound. It also checks the database settings once, with a clear message.
db();
startMailRetryLoop();

export const handle: Handle = async ({ event, resolve }) => {
	event.locals.requestId = randomUUID();
	event.locals.user = null;
	event.locals.session = null;
	event.locals.membership = null;
	event.locals.authMethod = null;
	await resolveAuth(event);
	// Counted after sign-in is resolved, so a token holder's requests share one count.
	let response = (await limitApiRate(event)) ?? (await resolve(event));
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
