/**
 * Method choices and grouping in the page URL (browser-safe), so a view can be bookmarked.
 * The server checks the same parameters with zod (src/lib/server/populations/query.ts).
 */
export const METHOD_DEFAULTS = {
	fractile: '0.05',
	confidence: '0.95',
	percentile: '7',
	model: 'best-fit',
	method: 'prediction',
	rules: ''
} as const;

export type MethodKey = keyof typeof METHOD_DEFAULTS;
export const METHOD_KEYS = Object.keys(METHOD_DEFAULTS) as MethodKey[];

/** The URL with one parameter set (a default or empty value removes it). */
export function withParam(url: URL, key: string, value: string): URL {
	const next = new URL(url);
	const fallback = (METHOD_DEFAULTS as Record<string, string>)[key];
	if (value === '' || value === fallback) next.searchParams.delete(key);
	else next.searchParams.set(key, value);
	return next;
}

/** The current value of a method parameter, or its default. */
export function methodValue(url: URL, key: MethodKey): string {
	return url.searchParams.get(key) ?? METHOD_DEFAULTS[key];
}

/** Fetch JSON from our API; a failed answer throws its `{ error: { message } }` text. */
export async function fetchJson<T>(fetcher: typeof fetch, path: string): Promise<T> {
	const response = await fetcher(path, { headers: { accept: 'application/json' } });
	const body = await response.json().catch(() => null);
	if (!response.ok) {
		const message = body?.error?.message ?? `The server answered ${response.status}.`;
		throw new Error(message);
	}
	return body as T;
}
