/**
 * `npm run bench:pages`: the population overview of an asset with 1,000,000 readings in 100
 * groups (median of 5, target < 1 s) and a population detail of 100,000 readings (target
 * < 300 ms), through the same service the API routes call, on a scratch database of the test
 * instance (start it with `npm test` or `bash scripts/services.sh start test`).
 * Not yet here: the autocannon run on the HTTP route (see docs/performance.md).
 */
import { QueryTypes } from 'sequelize';
import { loadTestEnv } from '../helpers/env';
import { scratchDatabase } from '../helpers/database';

loadTestEnv();
const scratch = await scratchDatabase('bench_pages');
process.env.DB_NAME = scratch.sequelize.getDatabaseName();
const { createMigrator } = await import('../../src/lib/server/db/migrator');
const { initModels } = await import('../../src/lib/server/db/models');
initModels(scratch.sequelize);
await createMigrator(scratch.sequelize).up();
const { populationOverview, populationDetail, methodSchema } =
	await import('../../src/lib/server/populations');
const { db, closeDb } = await import('../../src/lib/server/db');

const q = (sql: string, replacements: unknown[] = []) =>
	scratch.sequelize.query(sql, { replacements, type: QueryTypes.INSERT });
await q(
	"INSERT INTO organisations (name, slug, created_at, updated_at) VALUES ('Bench', 'bench', NOW(), NOW())"
);
await q(
	"INSERT INTO assets (organisation_id, name, design_code, design_service_life_years, created_at, updated_at) VALUES (1, 'Bench asset', 'EN 1992-1-1', 50, NOW(), NOW())"
);
await q(
	"INSERT INTO surveys (asset_id, title, survey_date, created_at, updated_at) VALUES (1, 'Bench survey', '2025-01-01', NOW(), NOW())"
);
// 100 groups: 10 member types × exposure classes … 1,000 members of 1,000 readings each.
const types = ['slab', 'beam', 'column', 'wall', 'deck'];
const classes = Array.from({ length: 20 }, (_, i) => `X${i}`);
let memberId = 0;
const conn = await (
	await import('mariadb')
).createConnection({
	host: process.env.DB_HOST,
	port: Number(process.env.DB_PORT),
	user: process.env.DB_USER,
	password: process.env.DB_PASSWORD,
	database: process.env.DB_NAME
});
let seed = 1;
const rand = () => (seed = (seed * 1103515245 + 12345) % 2147483648) / 2147483648;
const started = Date.now();
for (const t of types)
	for (const c of classes)
		for (let m = 0; m < 10; m++) {
			memberId++;
			await conn.query(
				"INSERT INTO members (survey_id, asset_id, label, member_type, face, exposure_class, requirement_source, c_min_mm, c_nom_mm, delta_c_dev_mm, created_at, updated_at) VALUES (1, 1, ?, ?, 'top', ?, 'EN 1992-1-1', 35, 45, 10, NOW(), NOW())",
				[`M${memberId}`, t, c]
			);
			const rows = Array.from({ length: 1000 }, (_, i) => [
				memberId,
				(i % 40) * 100,
				Math.floor(i / 40) * 100,
				Math.round(
					(45 + 7 * Math.sqrt(-2 * Math.log(rand() || 1e-9)) * Math.cos(2 * Math.PI * rand())) * 10
				) / 10
			]);
			await conn.batch(
				'INSERT INTO readings (member_id, x_mm, y_mm, cover_mm) VALUES (?, ?, ?, ?)',
				rows
			);
		}
await conn.end();
console.log(`inserted 1,000,000 readings in ${((Date.now() - started) / 1000).toFixed(1)} s`);

db();
const choice = methodSchema.parse({});
const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];
async function time(fn: () => Promise<unknown>, runs = 5) {
	await fn();
	const out: number[] = [];
	for (let i = 0; i < runs; i++) {
		const t0 = performance.now();
		await fn();
		out.push(performance.now() - t0);
	}
	return out;
}
const overview = await time(() => populationOverview({ assetId: 1, split: 'none', choice }));
console.log(
	`overview, 1,000,000 readings in 100 groups: median ${median(overview).toFixed(0)} ms (runs ${overview.map((x) => x.toFixed(0)).join(', ')})`
);
// A 100,000-reading detail: one member type across 10 exposure classes is 10 groups; take
// one type × class at 10,000 and a whole type (200,000) is too big, so time 10 groups' worth by
// filtering to member type 'slab' and exposure X0 … X9 would be several calls: instead the
// detail of one type × class, repeated with a larger set below.
await q('UPDATE members SET exposure_class = ? WHERE member_type = ? AND exposure_class IN (?)', [
	'BIG',
	'deck',
	classes.slice(0, 10)
]);
const detail = await time(() =>
	populationDetail({ assetId: 1, choice }, { type: 'deck', exposure: 'BIG' })
);
console.log(
	`detail, 100,000 readings with chart data: median ${median(detail).toFixed(0)} ms (runs ${detail.map((x) => x.toFixed(0)).join(', ')})`
);
await closeDb();
await scratch.drop();
