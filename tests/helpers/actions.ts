import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { routeIds } from './routes';

/**
 * Every form action of the app as a path to post to ("/account/tokens?/create", "/sign-in"),
 * read from the `actions` objects in src/routes, with each route parameter filled by `fill`.
 * A new action is attacked by the tests that use this list without anyone adding it.
 */
export function formActionPaths(fill = '1', root = 'src/routes'): string[] {
	const files = locate(root);
	const paths: string[] = [];
	for (const id of routeIds(root)) {
		const file = files.get(id);
		if (!file) continue;
		const names = actionNames(readFileSync(file, 'utf8'));
		const path = id.replace(/\[[^\]]+\]/g, fill);
		for (const name of names) paths.push(name === 'default' ? path : `${path}?/${name}`);
	}
	return paths.sort();
}

/** route id → its +page.server.ts, found beside the route's other files. */
function locate(root: string): Map<string, string> {
	const out = new Map<string, string>();
	const walk = (dir: string, id: string) => {
		for (const entry of readdirSync(dir, { withFileTypes: true })) {
			if (entry.isDirectory()) {
				const group = /^\(.+\)$/.test(entry.name);
				walk(join(dir, entry.name), group ? id : `${id === '/' ? '' : id}/${entry.name}`);
			} else if (entry.name === '+page.server.ts') out.set(id, join(dir, entry.name));
		}
	};
	walk(root, '/');
	return out;
}

/** The keys of `export const actions = { ... }`: lines `\tname:` or `\tname(` one tab in. */
export function actionNames(source: string): string[] {
	const start = source.indexOf('export const actions');
	if (start < 0) return [];
	const block = source.slice(start, source.indexOf('\n}', start));
	return [...block.matchAll(/^\t([A-Za-z_]\w*)\s*[:(]/gm)].map((m) => m[1]);
}

/**
 * The API routes that read a JSON body, with the methods that do ("POST /api/v1/tokens"), read
 * from the +server.ts files that call `readJson` (directly or through a `read…Body` helper).
 */
export function jsonBodyRoutes(fill = '3', root = 'src/routes'): [string, string][] {
	const out: [string, string][] = [];
	const walk = (dir: string, id: string) => {
		for (const entry of readdirSync(dir, { withFileTypes: true })) {
			const path = join(dir, entry.name);
			if (entry.isDirectory()) walk(path, `${id}/${entry.name}`);
			else if (entry.name === '+server.ts') {
				const source = readFileSync(path, 'utf8');
				if (!/readJson\(|read\w*Body\(/.test(source)) continue;
				for (const m of source.matchAll(/export const (POST|PUT|PATCH)\b/g)) {
					out.push([id.replace(/\[[^\]]+\]/g, fill), m[1]]);
				}
			}
		}
	};
	walk(join(root, 'api'), '/api');
	return out.sort();
}
