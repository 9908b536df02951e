/**
 * `npm run bench:pages`: the population overview of an asset with 1,000,000 readings in 100
 * groups (median of 5, target < 1 s) and a population detail of 100,000 readings (target
 * < 300 ms), through the same service the API routes call, in the test database (start it with
 * `bash scripts/services.sh start test`; the bench's own rows are removed afterwards).
 * Run by vitest (project bench-pages) so $lib and $env resolve as in the app; it measures and
 * prints, it asserts nothing about time. Not yet here: the autocannon run on the HTTP route (see docs/performance.md).
 */
import { QueryTypes } from 'sequelize';
import { it } from 'vitest';
import { loadTestEnv } from '../helpers/env';

loadTestEnv();

it('measures the population pages', { timeout: 600_000 }, async () => {
	// In the test database itself (the app's own `$env` points there), as an extra organisation
	// and asset removed at the end.
	const { populationOverview, populationDetail, memberComparison, methodSchema } =
		await import('../../src/lib/server/populations');
	const { fitNormalMixtureCounted } = await import('../../src/lib/analysis');
	const { db, closeDb } = await import('../../src/lib/server/db');
	const sequelize = db();
	const q = (sql: string, replacements: unknown[] = []) =>
		sequelize.query(sql, { replacements, type: QueryTypes.INSERT });
	const [orgId] = await q(
		"INSERT INTO organisations (name, slug, created_at, updated_at) VALUES ('Bench', 'bench-pages', NOW(), NOW())"
	);
	const [assetId] = await q(
		"INSERT INTO assets (organisation_id, name, design_code, design_service_life_years, created_at, updated_at) VALUES (?, 'Bench asset', 'EN 1992-1-1', 50, NOW(), NOW())",
		[orgId]
	);
	const [surveyId] = await q(
		"INSERT INTO surveys (asset_id, title, survey_date, created_at, updated_at) VALUES (?, 'Bench survey', '2025-01-01', NOW(), NOW())",
		[assetId]
	);
	// 100 groups (5 member types × 20 exposure classes) of 10 members × 1,000 readings.
	const types = ['slab', 'beam', 'column', 'wall', 'deck'];
	const classes = Array.from({ length: 20 }, (_, i) => `X${i}`);
	const memberIds: number[] = [];
	for (const t of types)
		for (const c of classes)
			for (let m = 0; m < 10; m++) {
				const [id] = await q(
					"INSERT INTO members (survey_id, asset_id, label, member_type, face, exposure_class, requirement_source, c_min_mm, c_nom_mm, delta_c_dev_mm, created_at, updated_at) VALUES (?, ?, ?, ?, 'top', ?, 'EN 1992-1-1', 35, 45, 10, NOW(), NOW())",
					[surveyId, assetId, `M${memberIds.length + 1}`, t, c]
				);
				memberIds.push(id as number);
			}
	const mariadb = await import('mariadb');
	const conn = await mariadb.createConnection({
		host: process.env.DB_HOST,
		port: Number(process.env.DB_PORT),
		user: process.env.DB_USER,
		password: process.env.DB_PASSWORD,
		database: process.env.DB_NAME
	});
	let seed = 1;
	const rand = () => (seed = (seed * 1103515245 + 12345) % 2147483648) / 2147483648;
	const normal = () => Math.sqrt(-2 * Math.log(rand() || 1e-9)) * Math.cos(2 * Math.PI * rand());
	const started = Date.now();
	for (let start = 0; start < memberIds.length; start += 50) {
		const rows: number[][] = [];
		for (const id of memberIds.slice(start, start + 50))
			for (let i = 0; i < 1000; i++)
				rows.push([
					id,
					(i % 40) * 100,
					Math.floor(i / 40) * 100,
					Math.round((45 + 7 * normal()) * 10) / 10
				]);
		await conn.beginTransaction();
		await conn.batch(
			'INSERT INTO readings (member_id, x_mm, y_mm, cover_mm) VALUES (?, ?, ?, ?)',
			rows
		);
		await conn.commit();
	}
	// The members' cover sets, as the import keeps them (one rebuild here instead of a merge).
	const { rebuildCoverSets } = await import('../../src/lib/server/readings/coverSets');
	for (let start = 0; start < memberIds.length; start += 50)
		await sequelize.transaction((t) => rebuildCoverSets(t, memberIds.slice(start, start + 50)));
	console.log(
		`inserted 1,000,000 readings and their cover sets in ${((Date.now() - started) / 1000).toFixed(1)} s`
	);

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
	// The first view of this data, before the engine has remembered any of its solver results.
	const coldStart = performance.now();
	const check = await populationOverview({ assetId, split: 'none', choice });
	console.log(`overview, first view (cold): ${(performance.now() - coldStart).toFixed(0)} ms`);
	const total = check.populations.reduce((s, p) => s + (p.assessment?.description.n ?? 0), 0);
	if (check.populations.length !== 100 || total !== 1_000_000)
		throw new Error(`bench data wrong: ${check.populations.length} groups, ${total} readings`);
	const overview = await time(() => populationOverview({ assetId, split: 'none', choice }));
	console.log(
		`overview, 1,000,000 readings in 100 groups: median ${median(overview).toFixed(0)} ms (runs ${overview.map((x) => x.toFixed(0)).join(', ')})`
	);
	// Where the overview's time goes: gathering (members and cover sets) apart from the engine.
	const { gatherGroups } = await import('../../src/lib/server/populations/groups');
	const gathering = await time(() => gatherGroups({ assetId }, 'none'));
	console.log(`  of which gathering the covers: median ${median(gathering).toFixed(0)} ms`);
	// 100,000 readings in one population: the deck members of ten classes moved into one.
	await sequelize.query(
		"UPDATE members SET exposure_class = 'BIG' WHERE asset_id = ? AND member_type = 'deck' AND exposure_class IN (?)",
		{ replacements: [assetId, classes.slice(0, 10)], type: QueryTypes.UPDATE }
	);
	const one = await populationDetail({ assetId, choice }, { type: 'deck', exposure: 'BIG' });
	if (one?.result.assessment?.description.n !== 100_000)
		throw new Error('bench detail is not 100,000 readings');
	const detail = await time(() =>
		populationDetail({ assetId, choice }, { type: 'deck', exposure: 'BIG' })
	);
	console.log(
		`detail, 100,000 readings with chart data: median ${median(detail).toFixed(0)} ms (runs ${detail.map((x) => x.toFixed(0)).join(', ')})`
	);
	// The detail's extras, paid only there: members compared, and the mixture (fitted on the
	// page only when neither model fits; timed here whatever the fit).
	const members = await time(async () => memberComparison(one.group));
	console.log(
		`  + members compared (${one.group.members.length} members): median ${median(members).toFixed(0)} ms`
	);
	const mixture = await time(async () => fitNormalMixtureCounted(one.group.sample, { seed: 1 }));
	console.log(`  + two-component mixture by EM: median ${median(mixture).toFixed(0)} ms`);
	await conn.query('DELETE FROM readings WHERE member_id IN (?)', [memberIds]);
	await conn.query('DELETE FROM members WHERE asset_id = ?', [assetId]);
	await conn.query('DELETE FROM surveys WHERE asset_id = ?', [assetId]);
	await conn.query('DELETE FROM assets WHERE id = ?', [assetId]);
	await conn.query('DELETE FROM organisations WHERE id = ?', [orgId]);
	await conn.end();
	await closeDb();
});
