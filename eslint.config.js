import js from '@eslint/js';
import ts from 'typescript-eslint';
import svelte from 'eslint-plugin-svelte';
import { importX } from 'eslint-plugin-import-x';
import { createTypeScriptImportResolver } from 'eslint-import-resolver-typescript';
import globals from 'globals';
import svelteConfig from './svelte.config.js';

/**
 * The linter keeps the seams of DEVELOPERS.md ("Conventions"): no unused code, no import cycles,
 * and the boundaries between the engine, the services and the routes. Type-aware rules are left
 * out: they need a whole TypeScript program per run, and `npm run check` type-checks already.
 * The resolver reads .svelte-kit/tsconfig.json for `$lib`: `npm run lint` syncs it first.
 */

/** The route layer: the only code under src/lib/server that may speak HTTP (SvelteKit). */
const ROUTE_LAYER = ['src/lib/server/web/**'];

/**
 * Services that still throw SvelteKit's error()/redirect() themselves. Each moves behind the
 * route layer (throwing domain errors from domainErrors.ts instead); this list only shrinks.
 */
const KIT_IN_SERVICES = [].map(literal);

/** Routes that still read models themselves; each moves to a service. This list only shrinks. */
const MODELS_IN_ROUTES = [].map(literal);

/** A path as a glob that matches only itself ([id] and (app) are glob syntax). */
function literal(path) {
	return path.replace(/[[\]()*?!+@]/g, '\\$&');
}

const restricted = (...patterns) => ['error', { patterns }];
const KIT = {
	group: ['@sveltejs/kit'],
	message:
		'Services do not speak HTTP: throw an error from $lib/server/domainErrors; the route layer ($lib/server/web) turns it into a response.'
};
const MODELS = {
	group: ['$lib/server/db', '$lib/server/db/*', '**/lib/server/db', '**/lib/server/db/*'],
	message: 'Routes do not read models: call a service in $lib/server.'
};
const SERVER = {
	group: ['$lib/server', '$lib/server/*', '**/lib/server', '**/lib/server/*', '../server/*'],
	message: 'The engine is pure: nothing of $lib/server in $lib/analysis.'
};

const LUCIA_MESSAGE =
	'Sessions go through $lib/server/auth/session (the one file that knows lucia).';

export default ts.config(
	{
		ignores: ['build/', '.svelte-kit/', '.local/', 'node_modules/', 'static/', 'docs/', 'coverage/']
	},
	js.configs.recommended,
	...ts.configs.recommended,
	...svelte.configs.recommended,
	{
		languageOptions: { globals: { ...globals.browser, ...globals.node } }
	},
	{
		files: ['**/*.svelte', '**/*.svelte.ts', '**/*.svelte.js'],
		languageOptions: {
			parserOptions: { extraFileExtensions: ['.svelte'], parser: ts.parser, svelteConfig }
		}
	},
	{
		plugins: { 'import-x': importX },
		settings: {
			'import-x/resolver-next': [createTypeScriptImportResolver({ alwaysTryTypes: true })]
		},
		rules: {
			'@typescript-eslint/no-unused-vars': [
				'error',
				{ argsIgnorePattern: '^_', varsIgnorePattern: '^_', caughtErrors: 'none' }
			],
			'import-x/no-cycle': ['error', { ignoreExternal: true }],
			// The app is served at the root (no `paths.base`), so resolve() would add nothing to a link.
			'svelte/no-navigation-without-resolve': 'off',
			// Flags every URLSearchParams/Set built inside a function to make a URL or a copy; the
			// reactive ones (SvelteSet...) are for state that is mutated in place, which we do not do.
			'svelte/prefer-svelte-reactivity': 'off',
			// {'a\nb'} is how an attribute gets a newline.
			'svelte/no-useless-mustaches': ['error', { ignoreStringEscape: true }]
		}
	},
	{
		files: ['src/lib/server/**'],
		ignores: [...ROUTE_LAYER, ...KIT_IN_SERVICES],
		rules: { 'no-restricted-imports': restricted(KIT) }
	},
	{
		files: ['src/routes/**'],
		ignores: MODELS_IN_ROUTES,
		rules: { 'no-restricted-imports': restricted(MODELS) }
	},
	{
		// A migration is history: it copies the literals it needs, so live code cannot change it.
		files: ['src/lib/server/db/migrations/**'],
		rules: {
			'no-restricted-imports': restricted({
				group: ['../../*', '$lib/*'],
				message: 'A migration imports nothing live: copy the literal into it.'
			})
		}
	},
	{
		files: ['src/lib/analysis/**'],
		rules: { 'no-restricted-imports': restricted(SERVER) }
	},
	{
		// Nor does live code import a migration: word lists come from $lib/words. Only the
		// migrator, the script that runs it and the migrations' own tests reach into the folder.
		files: ['**/*.{js,ts,svelte}'],
		ignores: [
			'src/lib/server/db/migrations/**',
			'src/lib/server/db/migrator.ts',
			'scripts/migrate.ts',
			'tests/integration/migrations*.test.ts'
		],
		rules: {
			'import-x/no-restricted-paths': [
				'error',
				{
					zones: [
						{
							target: '.',
							from: './src/lib/server/db/migrations',
							message: 'A migration is history: take word lists from $lib/words.'
						}
					]
				}
			]
		}
	},
	{
		// lucia is deprecated upstream: sessions go through auth/session.ts alone, so replacing it
		// changes one file. The rule's typescript-eslint twin is used so that it adds to the
		// folders' no-restricted-imports above instead of replacing their options.
		files: ['**/*.{js,ts,svelte}'],
		ignores: ['src/lib/server/auth/session.ts'],
		rules: {
			'@typescript-eslint/no-restricted-imports': [
				'error',
				{
					paths: [{ name: 'lucia', message: LUCIA_MESSAGE }],
					patterns: [{ group: ['lucia/*'], message: LUCIA_MESSAGE }]
				}
			]
		}
	}
);
