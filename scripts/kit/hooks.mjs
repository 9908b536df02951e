// Resolves SvelteKit's module aliases for scripts run by tsx outside Vite (the seed builds its
// assessments with the app's own services): `$lib/...` is src/lib, `$env/dynamic/private` and
// `$app/environment` are small stand-ins reading process.env. tsx's own hooks then load the
// TypeScript; only these prefixes are touched.
import { pathToFileURL } from 'node:url';
import { resolve as resolvePath } from 'node:path';

const root = resolvePath(import.meta.dirname, '../..');
const standIns = {
	'$env/dynamic/private': resolvePath(root, 'scripts/kit/env.ts'),
	'$app/environment': resolvePath(root, 'scripts/kit/environment.ts')
};

export async function resolve(specifier, context, nextResolve) {
	if (specifier in standIns) return nextResolve(pathToFileURL(standIns[specifier]).href, context);
	if (specifier === '$lib' || specifier.startsWith('$lib/')) {
		const target = resolvePath(root, 'src/lib', specifier.slice('$lib/'.length));
		return nextResolve(pathToFileURL(target).href, context);
	}
	return nextResolve(specifier, context);
}
