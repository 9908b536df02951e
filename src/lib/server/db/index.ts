import type { Sequelize } from 'sequelize';
import { env } from '$env/dynamic/private';
import { createSequelize, readDatabaseSettings } from './connection';
import { initModels } from './models';

let instance: Sequelize | null = null;

/** The app's one Sequelize instance, created on first use from the environment. */
export function db(): Sequelize {
	if (!instance) {
		instance = createSequelize(readDatabaseSettings(env));
		initModels(instance);
	}
	return instance;
}

/** Closes the pool (graceful shutdown, STACK.md pitfall 5). */
export async function closeDb(): Promise<void> {
	if (instance) {
		const closing = instance;
		instance = null;
		await closing.close();
	}
}

export * from './models';
