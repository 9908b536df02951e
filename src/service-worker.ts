/// <reference types="@sveltejs/kit" />
/// <reference no-default-lib="true"/>
/// <reference lib="esnext" />
/// <reference lib="webworker" />
import { build, files, version } from '$service-worker';

/**
 * Keeps the app working on site without a signal: the app's own scripts, styles and static files
 * (cached at install, replaced with each version), and the on-site entry pages of the surveys
 * opened here (their HTML carries the survey's members), refreshed from the network whenever it
 * answers. Nothing else is cached: other pages hold data that must be current.
 */
const sw = self as unknown as ServiceWorkerGlobalScope;
const SHELL = `shell-${version}`;
const PAGES = 'site-pages';
const SHELL_FILES = new Set([...build, ...files]);
const SITE_PAGE = /^\/surveys\/\d+\/site(\/__data\.json)?$/;

sw.addEventListener('install', (event) => {
	event.waitUntil(
		caches
			.open(SHELL)
			.then((cache) => cache.addAll([...SHELL_FILES]))
			.then(() => sw.skipWaiting())
	);
});

sw.addEventListener('activate', (event) => {
	event.waitUntil(
		caches
			.keys()
			.then((keys) =>
				Promise.all(
					keys.filter((k) => k.startsWith('shell-') && k !== SHELL).map((k) => caches.delete(k))
				)
			)
			.then(() => sw.clients.claim())
	);
});

/** Network first; a good answer replaces the cached copy, and the copy answers when offline. */
async function siteFirstFromNetwork(request: Request): Promise<Response> {
	const cache = await caches.open(PAGES);
	try {
		const response = await fetch(request);
		// A redirect (to sign-in) or an error page is not the page: keep the last good copy.
		if (response.ok && !response.redirected && response.type === 'basic') {
			await cache.put(request.url.split('?')[0], response.clone());
		}
		return response;
	} catch (err) {
		const cached = await cache.match(request.url.split('?')[0]);
		if (cached) return cached;
		throw err;
	}
}

sw.addEventListener('fetch', (event) => {
	const url = new URL(event.request.url);
	if (url.origin !== sw.location.origin) return;
	// Signing out takes the cached pages with it: they show the organisation's survey data.
	if (url.pathname.startsWith('/sign-out')) {
		event.waitUntil(caches.delete(PAGES));
		return;
	}
	if (event.request.method !== 'GET') return;
	if (SHELL_FILES.has(url.pathname)) {
		event.respondWith(caches.match(url.pathname).then((hit) => hit ?? fetch(event.request)));
		return;
	}
	if (SITE_PAGE.test(url.pathname)) event.respondWith(siteFirstFromNetwork(event.request));
});
