import { describe, expect, it } from 'vitest';
import { appUrl } from '../helpers/env';
import { can } from '../../src/lib/server/policy';
import { signInAs, type DemoRole, type HttpClient } from '../helpers/session';

/**
 * No link leads to a refusal: for each demo role, start at the dashboard and follow every
 * same-origin link on every page reached, over HTTP against the built app. A link the role may
 * not follow (403) or that points nowhere (404) is a fault of the page that shows it.
 */
const ROLES: DemoRole[] = ['surveyor', 'engineer', 'owner', 'admin', 'researcher'];
/** Pages fetched per role at most. */
const PAGE_LIMIT = 300;
/**
 * Pages fetched per route shape (numbers replaced by ":id"): members of one structure share
 * their links, so a few of each shape reach every kind of link without fetching thousands.
 */
const PER_SHAPE = 3;

/** Links that end the session or hand over to another place; following them changes state. */
function skipped(path: string): boolean {
	return path === '/sign-out' || path.startsWith('/switch-organisation');
}

function shapeOf(url: URL): string {
	return url.pathname.replace(/\/\d+(?=\/|$)/g, '/:id');
}

/** The href of every <a> in a page, resolved against the page's address. */
function linksIn(html: string, base: URL): URL[] {
	const found: URL[] = [];
	for (const match of html.matchAll(/<a\b[^>]*?\shref="([^"]*)"/g)) {
		const href = match[1].replace(/&amp;/g, '&');
		if (!href || href.startsWith('#') || href.startsWith('mailto:')) continue;
		const url = new URL(href, base);
		url.hash = '';
		if (url.origin === base.origin) found.push(url);
	}
	return found;
}

interface Refusal {
	url: string;
	status: number;
	from: string;
}

async function fetchFollowing(
	client: HttpClient,
	url: URL
): Promise<{ status: number; final: URL; html: string }> {
	let current = url;
	for (let hop = 0; hop < 5; hop++) {
		const response = await client.get(current.pathname + current.search);
		const location = response.headers.get('location');
		if (response.status >= 300 && response.status < 400 && location) {
			await response.body?.cancel();
			current = new URL(location, current);
			continue;
		}
		const type = response.headers.get('content-type') ?? '';
		const html = type.includes('text/html') ? await response.text() : '';
		if (!html) await response.body?.cancel();
		return { status: response.status, final: current, html };
	}
	throw new Error(`too many redirects from ${url}`);
}

async function crawl(role: DemoRole): Promise<{ visited: string[]; refusals: Refusal[] }> {
	const client = await signInAs(role);
	const start = new URL('/dashboard', appUrl());
	const queue: { url: URL; from: string }[] = [{ url: start, from: '(start)' }];
	const seen = new Set<string>([start.href]);
	const perShape = new Map<string, number>();
	const visited: string[] = [];
	const refusals: Refusal[] = [];
	while (queue.length > 0 && visited.length < PAGE_LIMIT) {
		const { url, from } = queue.shift()!;
		const shape = shapeOf(url);
		const count = perShape.get(shape) ?? 0;
		if (count >= PER_SHAPE) continue;
		perShape.set(shape, count + 1);
		const { status, final, html } = await fetchFollowing(client, url);
		visited.push(url.pathname + url.search);
		if (status === 403 || status === 404) {
			refusals.push({ url: url.pathname + url.search, status, from });
		}
		if (final.pathname === '/sign-in') {
			refusals.push({ url: url.pathname + url.search, status: 401, from });
		}
		for (const link of linksIn(html, final)) {
			if (skipped(link.pathname) || seen.has(link.href)) continue;
			seen.add(link.href);
			queue.push({ url: link, from: url.pathname + url.search });
		}
	}
	return { visited, refusals };
}

describe('every link a role is shown can be followed', () => {
	for (const role of ROLES) {
		it(`as ${role}: no link from the dashboard onwards meets 403 or 404`, async () => {
			const { visited, refusals } = await crawl(role);
			// The crawl must actually walk the app, not stop at the first page.
			expect(visited.length, `pages reached as ${role}`).toBeGreaterThan(
				role === 'researcher' ? 3 : 10
			);
			expect(refusals, JSON.stringify(refusals, null, 1)).toEqual([]);
		}, 180_000);
	}
});

describe('the asset page leads on as the role allows', () => {
	for (const role of ['surveyor', 'engineer', 'owner', 'admin'] as const) {
		it(`as ${role}: populations, assessments and the owner's summary, each only if allowed`, async () => {
			const client = await signInAs(role);
			const assets = await (await client.get('/assets')).text();
			const assetId = assets.match(/href="\/assets\/(\d+)"/)?.[1];
			expect(assetId, 'the assets list links an asset').toBeTruthy();
			const html = await (await client.get(`/assets/${assetId}`)).text();
			const onward = html.match(/data-testid="asset-onward"[\s\S]*?<\/nav>/)?.[0] ?? '';
			const expected: [string, boolean][] = [
				[`/assets/${assetId}/populations`, can(role, 'population:read')],
				[`/assets/${assetId}/assessments`, can(role, 'assessment:read')],
				[`/portfolio/${assetId}`, can(role, 'report:read')]
			];
			for (const [href, allowed] of expected) {
				expect(onward.includes(`href="${href}"`), `${href} shown to ${role}`).toBe(allowed);
			}
		});
	}
});
