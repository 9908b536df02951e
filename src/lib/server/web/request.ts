import type { RequestEvent } from '@sveltejs/kit';
import type { SessionCookie } from '../auth/session';

/** Sets a cookie the session layer made (name, value, attributes) through SvelteKit's cookie API. */
export function setCookie(event: Pick<RequestEvent, 'cookies'>, cookie: SessionCookie): void {
	event.cookies.set(cookie.name, cookie.value, { path: '/', ...cookie.attributes });
}

/** The caller's address; behind a proxy adapter-node reads it from ADDRESS_HEADER. */
export function clientAddress(event: Pick<RequestEvent, 'getClientAddress'>): string {
	try {
		return event.getClientAddress().slice(0, 45);
	} catch {
		return 'unknown';
	}
}
