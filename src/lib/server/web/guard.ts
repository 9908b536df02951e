import { redirect, type RequestEvent } from '@sveltejs/kit';
import type { Action, Actor } from '../policy';
import { authorize } from './actor';

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

/** Any base will do: only whether a path stays on it matters. */
const PROBE_ORIGIN = 'https://fractile.invalid';

/**
 * Control characters and backslashes are refused outright rather than cleaned: browsers drop tab
 * and newline anywhere in a URL (so "/\t/evil.example" becomes "//evil.example") and read "\" as
 * "/"; a newline in a Location header is also refused by Node itself (a 500, not a redirect).
 */
const UNSAFE_CHARACTER = /[\p{Cc}\\]/u; // Cc: U+0000–001F and U+007F–009F

/**
 * Only paths on our own site, so `next` cannot send anyone elsewhere after sign-in. The path is
 * returned as the URL parser serialises it (non-ASCII percent-encoded, "/./" resolved), and that
 * serialised form is checked again: "/.//evil.example" resolves to "//evil.example".
 */
export function safeNext(next: string | null | undefined, fallback = '/dashboard'): string {
	if (!next || next.length > 2048 || !next.startsWith('/') || next.startsWith('//'))
		return fallback;
	if (UNSAFE_CHARACTER.test(next)) return fallback;
	let url: URL;
	try {
		url = new URL(next, PROBE_ORIGIN);
	} catch {
		return fallback;
	}
	const path = url.pathname + url.search + url.hash;
	if (url.origin !== PROBE_ORIGIN || !path.startsWith('/') || path.startsWith('//'))
		return fallback;
	return path;
}
