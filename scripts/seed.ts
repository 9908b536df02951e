// Loads the demo scenario: `tsx scripts/seed.ts` (refuses a database that holds data),
// `--if-empty` (quietly skips one that does), `--reset` (wipes every table first).
import { register } from 'node:module';
import { createSequelize, readDatabaseSettings } from '../src/lib/server/db/connection';
import { initModels } from '../src/lib/server/db/models';
import { DEMO_PASSWORD, demoPeople } from '../seeds/scenario';
import { loadProjectEnv } from './env';

loadProjectEnv();
// The demo's assessments are saved through the app's services, which import SvelteKit's aliases
// ($lib, $env): resolve them before the seed is loaded (scripts/kit/hooks.mjs).
register('./kit/hooks.mjs', import.meta.url);
const { clearAllData, isDatabaseEmpty, loadDemoScenario } = await import('../seeds/load');
const sequelize = createSequelize(readDatabaseSettings(process.env));
initModels(sequelize);
const args = new Set(process.argv.slice(2));

try {
	if (!(await isDatabaseEmpty(sequelize))) {
		if (args.has('--if-empty')) {
			console.log('database already holds data: demo scenario not loaded');
			process.exit(0);
		}
		if (!args.has('--reset'))
			throw new Error(
				'the database already holds data; run `npm run seed -- --reset` to wipe it and reload the demo'
			);
		await clearAllData(sequelize);
	}
	const started = performance.now();
	const { readings, members, assessments } = await loadDemoScenario(sequelize);
	console.log(
		`demo scenario loaded: ${members} members, ${readings} readings, ${assessments} approved assessments in ${Math.round(performance.now() - started)} ms`
	);
	console.log(`demo sign-ins (password "${DEMO_PASSWORD}"):`);
	for (const p of demoPeople) console.log(`  ${p.role.padEnd(10)} ${p.email}`);
} catch (err) {
	console.error(`seed failed: ${err instanceof Error ? err.message : err}`);
	process.exitCode = 1;
} finally {
	await sequelize.close();
}
