import { redirect, type RequestEvent } from '@sveltejs/kit';
import { authorize, type Action, type Actor } from './policy';

/**
 * For page loads: a signed-out visitor is sent to sign in (and brought back afterwards);
 * a signed-in one is asked of the policy like everywhere else. Form actions and /api routes
 * call `authorize` directly and answer 401 rather than redirect.
 */
export function pageActor(event: Pick<RequestEvent, 'locals' | 'url'>, action: Action): Actor {
	if (!event.locals.user) redirect(303, signInUrl(event.url));
	return authorize(event.locals, action);
}

export function signInUrl(url: URL): string {
	return `/sign-in?next=${encodeURIComponent(url.pathname + url.search)}`;
}

/** Only paths on our own site, so `next` cannot send anyone elsewhere after sign-in. */
export function safeNext(next: string | null | undefined, fallback = '/dashboard'): string {
	if (!next || !next.startsWith('/') || next.startsWith('//') || next.startsWith('/\\')) {
		return fallback;
	}
	return next;
}
