import type { RequestEvent } from '@sveltejs/kit';
import type { Cookie } from 'lucia';

/** Sets a cookie lucia made (name, value, attributes) through SvelteKit's cookie API. */
export function setCookie(event: Pick<RequestEvent, 'cookies'>, cookie: Cookie): void {
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
