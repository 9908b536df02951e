import { existsSync } from 'node:fs';
import { resolve } from 'node:path';

/**
 * Loads the env file the shell scripts wrote (.env for the dev instance, .env.test for the
 * throwaway one, chosen by FRACTILE_ENV_FILE) without overriding variables already set.
 */
export function loadProjectEnv(): string {
	const file = resolve(process.env.FRACTILE_ENV_FILE ?? '.env');
	if (existsSync(file)) {
		const before = { ...process.env };
		process.loadEnvFile(file);
		Object.assign(process.env, before);
	}
	return file;
}
