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

/**
 * Makes `sequelize` the app's instance. Scripts that call the app's services (the seed saves and
 * approves its assessments through them) bring their own instance; without this, db() would open
 * a second pool and rebind every model to it.
 */
export function useDatabase(sequelize: Sequelize): void {
	initModels(sequelize);
	instance = sequelize;
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
