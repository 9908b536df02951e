import { readdirSync } from 'node:fs';
import { join, relative, sep } from 'node:path';

const ROUTE_FILES = new Set(['+page.svelte', '+page.server.ts', '+page.ts', '+server.ts']);

/**
 * Every route id of the app as SvelteKit spells it ("/assets/[assetId]/populations"), read from
 * the file tree under src/routes with route groups such as "(app)" left out, so that a test can
 * insist that each route has a case: a new route without one fails the test that lists them.
 */
export function routeIds(root = 'src/routes'): string[] {
	const ids = new Set<string>();
	const walk = (dir: string) => {
		for (const entry of readdirSync(dir, { withFileTypes: true })) {
			if (entry.isDirectory()) walk(join(dir, entry.name));
			else if (ROUTE_FILES.has(entry.name)) ids.add(routeIdOf(relative(root, dir)));
		}
	};
	walk(root);
	return [...ids].sort();
}

function routeIdOf(dir: string): string {
	const segments = dir.split(sep).filter((s) => s && !/^\(.+\)$/.test(s));
	return '/' + segments.join('/');
}

/** The routes whose path carries a parameter ("[id]", "[assetId]", "[token]"...). */
export function routeIdsWithParams(root?: string): string[] {
	return routeIds(root).filter((id) => id.includes('['));
}
