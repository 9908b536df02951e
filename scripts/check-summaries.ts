// Rebuilds every member's reading count and cover counts from the readings and compares them with
// the stored ones: `npm run db:check-summaries`. Exit code 1 on any difference.
import { createSequelize, readDatabaseSettings } from '../src/lib/server/db/connection';
import { checkCoverSummaries } from '../src/lib/server/readings/checkSummaries';
import { loadProjectEnv } from './env';

loadProjectEnv();
// A full check reads every reading once: minutes on a large database, not a request's 30 s.
const sequelize = createSequelize({
	...readDatabaseSettings(process.env),
	DB_QUERY_TIMEOUT_MS: Number(process.env.MIGRATION_QUERY_TIMEOUT_MS ?? 3_600_000)
});
try {
	const started = Date.now();
	const check = await checkCoverSummaries(sequelize);
	for (const m of check.mismatches.slice(0, 50))
		console.error(`member ${m.memberId}: ${m.problem}`);
	console.log(
		`${check.membersChecked} members, ${check.readingsChecked} readings checked in ${((Date.now() - started) / 1000).toFixed(1)} s: ` +
			(check.mismatches.length === 0
				? 'every summary equals its readings'
				: `${check.mismatches.length} mismatch(es)`)
	);
	if (check.mismatches.length > 0) process.exitCode = 1;
} catch (err) {
	console.error(`check failed: ${err instanceof Error ? err.message : err}`);
	process.exitCode = 1;
} finally {
	await sequelize.close();
}
