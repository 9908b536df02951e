import { existsSync } from 'node:fs';
import { resolve } from 'node:path';

/** Test settings come from the throwaway instance's env file that `npm test` writes. */
export function loadTestEnv(): void {
	const file = resolve(process.env.FRACTILE_ENV_FILE ?? '.env.test');
	if (!existsSync(file)) {
		throw new Error(
			`${file} is missing: run the suite with \`npm test\`, which starts the test services`
		);
	}
	const before = { ...process.env };
	process.loadEnvFile(file);
	Object.assign(process.env, before);
}

/** The built app that `npm test` started for the integration and browser tests. */
export function appUrl(): string {
	const url = process.env.APP_URL ?? process.env.ORIGIN;
	if (!url) throw new Error('APP_URL is not set: run the suite with `npm test`');
	return url;
}
