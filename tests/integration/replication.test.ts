import { readFileSync } from 'node:fs';
import { parseEnv } from 'node:util';
import mariadb from 'mariadb';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createSequelize, readDatabaseSettings } from '../../src/lib/server/db/connection';
import { createMigrator } from '../../src/lib/server/db/migrator';
import { initModels } from '../../src/lib/server/db/models';
import { clearAllData, isDatabaseEmpty, loadDemoScenario } from '../../seeds/load';
import { startBuiltApp } from '../helpers/server';
import { httpClient, signInAs } from '../helpers/session';

// The pair that scripts/replication.sh starts (npm test starts it before the integration tests).
const pair = parseEnv(readFileSync('.env.replication', 'utf8')) as Record<string, string>;
const databaseEnv = {
	DB_HOST: '127.0.0.1',
	DB_PORT: pair.DB_PORT,
	DB_NAME: pair.DB_NAME,
	DB_USER: pair.DB_USER,
	DB_PASSWORD: pair.DB_PASSWORD
};

/** A counter of the replica's own: how many SELECTs it has served. */
async function replicaSelects(): Promise<number> {
	const connection = await mariadb.createConnection({
		host: '127.0.0.1',
		port: Number(pair.REPLICA_DB_PORT),
		user: pair.DB_USER,
		password: pair.DB_PASSWORD,
		database: pair.DB_NAME
	});
	try {
		const [row] = await connection.query("SHOW GLOBAL STATUS LIKE 'Com_select'");
		return Number(row.Value);
	} finally {
		await connection.end();
	}
}

async function eventually<T>(attempt: () => Promise<T | null>, timeoutMs = 5_000): Promise<T> {
	const deadline = Date.now() + timeoutMs;
	for (;;) {
		const value = await attempt();
		if (value !== null) return value;
		if (Date.now() > deadline) throw new Error('the replica did not catch up in time');
		await new Promise((r) => setTimeout(r, 100));
	}
}

describe('two app processes on a MariaDB primary and a replica', () => {
	let appA: Awaited<ReturnType<typeof startBuiltApp>>;
	let appB: Awaited<ReturnType<typeof startBuiltApp>>;

	beforeAll(async () => {
		const sequelize = createSequelize(readDatabaseSettings(databaseEnv));
		initModels(sequelize);
		await createMigrator(sequelize).up();
		if (!(await isDatabaseEmpty(sequelize))) await clearAllData(sequelize);
		await loadDemoScenario(sequelize);
		await sequelize.close();
		const appEnv = { ...databaseEnv, DB_READ_REPLICAS: `127.0.0.1:${pair.REPLICA_DB_PORT}` };
		[appA, appB] = await Promise.all([startBuiltApp(appEnv), startBuiltApp(appEnv)]);
	});

	afterAll(async () => {
		await Promise.all([appA?.stop(), appB?.stop()]);
	});

	it('reads back through one process what was written through the other', async () => {
		// The session is written by A and must be honoured by B: no per-user state in process memory.
		const engineerOnA = await signInAs('engineer', appA.origin);
		const name = `replication check ${Date.now()}`;
		const created = await engineerOnA.postJson('/api/v1/tokens', { name, expiresInDays: 30 });
		expect(created.status).toBe(201);

		const engineerOnB = httpClient({}, engineerOnA.cookie, appB.origin);
		expect((await engineerOnB.get('/api/v1/me', { accept: 'application/json' })).status).toBe(200);
		const listed = await eventually(async () => {
			const response = await engineerOnB.get('/api/v1/tokens', { accept: 'application/json' });
			const body = (await response.json()) as { tokens: { name: string }[] };
			return body.tokens.some((t) => t.name === name) ? body : null;
		});
		expect(listed.tokens.map((t) => t.name)).toContain(name);
	});

	it('sends reads to the replica', async () => {
		const engineer = await signInAs('engineer', appB.origin);
		const before = await replicaSelects();
		for (let i = 0; i < 10; i++) {
			const response = await engineer.get('/api/v1/tokens', { accept: 'application/json' });
			expect(response.status).toBe(200);
		}
		// Each listing is at least one SELECT on the replica; the counter query itself adds one.
		expect((await replicaSelects()) - before).toBeGreaterThanOrEqual(10);
	});
});
