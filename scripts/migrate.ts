// Runs the versioned migrations: `tsx scripts/migrate.ts up|down|status|reset`.
import { createSequelize, readDatabaseSettings } from '../src/lib/server/db/connection';
import { createMigrator } from '../src/lib/server/db/migrator';
import { loadProjectEnv } from './env';

loadProjectEnv();
const command = process.argv[2] ?? 'up';
// A migration may rebuild a table of millions of readings: minutes, not the app's 30 s per query.
const sequelize = createSequelize({
	...readDatabaseSettings(process.env),
	DB_QUERY_TIMEOUT_MS: Number(process.env.MIGRATION_QUERY_TIMEOUT_MS ?? 3_600_000)
});
const migrator = createMigrator(sequelize);

try {
	if (command === 'up') {
		const ran = await migrator.up();
		console.log(
			ran.length ? `applied: ${ran.map((m) => m.name).join(', ')}` : 'schema is up to date'
		);
	} else if (command === 'down') {
		const reverted = await migrator.down();
		console.log(
			reverted.length ? `reverted: ${reverted.map((m) => m.name).join(', ')}` : 'nothing to revert'
		);
	} else if (command === 'reset') {
		await migrator.down({ to: 0 });
		console.log('reverted every migration');
	} else if (command === 'status') {
		const executed = await migrator.executed();
		const pending = await migrator.pending();
		for (const m of executed) console.log(`  applied  ${m.name}`);
		for (const m of pending) console.log(`  pending  ${m.name}`);
	} else {
		throw new Error(`unknown command "${command}" (up, down, status, reset)`);
	}
} catch (err) {
	console.error(`migration failed: ${err instanceof Error ? err.message : err}`);
	process.exitCode = 1;
} finally {
	await sequelize.close();
}
