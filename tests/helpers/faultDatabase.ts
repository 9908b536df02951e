import { execFileSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { parseEnv } from 'node:util';
import { createSequelize, readDatabaseSettings } from '../../src/lib/server/db/connection';
import { createMigrator } from '../../src/lib/server/db/migrator';
import { initModels } from '../../src/lib/server/db/models';
import { clearAllData, isDatabaseEmpty, loadDemoScenario } from '../../seeds/load';

/**
 * The fault tests' own MariaDB (scripts/db.sh's `fault` instance, 127.0.0.1:3313), which they
 * stop and start under a running app without disturbing the suite's shared test database.
 */
export const faultDatabase = {
	start(): void {
		execFileSync('bash', ['scripts/db.sh', 'start', 'fault'], { stdio: 'pipe' });
	},
	stop(): void {
		execFileSync('bash', ['scripts/db.sh', 'stop', 'fault'], { stdio: 'pipe' });
	},
	env(): Record<string, string> {
		const file = parseEnv(readFileSync('.env.fault', 'utf8')) as Record<string, string>;
		return {
			DB_HOST: '127.0.0.1',
			DB_PORT: file.DB_PORT,
			DB_NAME: file.DB_NAME,
			DB_USER: file.DB_USER,
			DB_PASSWORD: file.DB_PASSWORD
		};
	},
	/** Starts it, migrates it and loads the demo scenario if it holds nothing. */
	async prepare(): Promise<Record<string, string>> {
		this.start();
		const env = this.env();
		const sequelize = createSequelize(readDatabaseSettings(env));
		initModels(sequelize);
		try {
			await createMigrator(sequelize).up();
			if (!(await isDatabaseEmpty(sequelize))) await clearAllData(sequelize);
			await loadDemoScenario(sequelize);
		} finally {
			await sequelize.close();
		}
		return env;
	}
};
