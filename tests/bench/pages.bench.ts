/**
 * `npm run bench:pages`: the population overview through the same service the API routes call,
 * in the test database (start it with `bash scripts/services.sh start test`; the bench's own
 * rows are removed afterwards). Two stocks of 100 groups (5 member types × 20 exposure classes)
 * of 10 members each:
 *  - 1,000,000 readings (1,000 a member): the overview, and the overview with every group's
 *    member test (Kruskal–Wallis, ANOVA, each member against the rest with Holm) and two-component
 *    mixture (target < 1 s); and a population detail of 100,000 readings;
 *  - 10,000,000 readings (10,000 a member): the overview (target < 100 ms).
 * The overview reads only the members' cover counts, so the bench writes those summaries
 * directly (member_cover_sets.cover_counts, counted from seeded readings on the 0.1 mm grid by
 * the engine's countedFromGridReadings and stored by the import's codec) and no readings rows:
 * generating 10^7 rows through the sequence took minutes, and no page here reads them. The
 * peer, in the same run on the same counts: numpy (tests/bench/pages_peer.py) computing n, mean,
 * SD, P5/P50/P95 and the share below c_min per group — far less than the engine's assessment
 * (both models' fits, Anderson–Darling, Kolmogorov–Smirnov, grouped chi-square, Clopper–Pearson
 * and the characteristic values), so the ratio is an upper bound on the engine's overhead.
 * Run by vitest (project bench-pages) so $lib and $env resolve as in the app; it measures and
 * prints medians, minima and the load average; it asserts nothing about time.
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { QueryTypes } from 'sequelize';
import { it } from 'vitest';
import { loadTestEnv } from '../helpers/env';

loadTestEnv();

const TYPES = ['slab', 'beam', 'column', 'wall', 'deck'];
const CLASSES = Array.from({ length: 20 }, (_, i) => `X${i}`);
const MEMBERS_PER_GROUP = 10;
const GRID = { den: 10, factor: 1 };
const PEER = fileURLToPath(new URL('./pages_peer.py', import.meta.url));

it('measures the population pages', { timeout: 1_800_000 }, async () => {
	const populations = await import('../../src/lib/server/populations');
	const { populationOverview, populationDetail, memberComparison, methodSchema, judgeGroup } =
		populations;
	const { gatherGroups, populationMixture } = populations;
	const analysis = await import('../../src/lib/analysis');
	const { countedFromGridReadings, fitNormalMixtureCounted, mulberry32, normalSampler } = analysis;
	const { encodeCounts } = await import('../../src/lib/server/readings/coverCountCodec');
	const { db, closeDb } = await import('../../src/lib/server/db');
	const sequelize = db();
	const q = (sql: string, replacements: unknown[] = []) =>
		sequelize.query(sql, { replacements, type: QueryTypes.INSERT });
	const [orgId] = await q(
		"INSERT INTO organisations (name, slug, created_at, updated_at) VALUES ('Bench', ?, NOW(), NOW())",
		[`bench-pages-${Date.now()}`]
	);
	const choice = methodSchema.parse({});
	const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];
	const fmt = (xs: number[]) =>
		`median ${median(xs).toFixed(1)} ms, min ${Math.min(...xs).toFixed(1)} ms (runs ${xs.map((x) => x.toFixed(0)).join(', ')})`;
	async function time(fn: () => Promise<unknown> | unknown, runs = 5) {
		await fn();
		const out: number[] = [];
		for (let i = 0; i < runs; i++) {
			const t0 = performance.now();
			await fn();
			out.push(performance.now() - t0);
		}
		return out;
	}
	const z = normalSampler(mulberry32(1));
	const assets: number[] = [];

	/** An asset of 100 groups × 10 members, each member's counts written as the import would. */
	async function stock(perMember: number) {
		const [assetId] = await q(
			"INSERT INTO assets (organisation_id, name, design_code, design_service_life_years, created_at, updated_at) VALUES (?, 'Bench asset', 'EN 1992-1-1', 50, NOW(), NOW())",
			[orgId]
		);
		assets.push(assetId as number);
		const [surveyId] = await q(
			"INSERT INTO surveys (asset_id, title, survey_date, created_at, updated_at) VALUES (?, 'Bench survey', '2025-01-01', NOW(), NOW())",
			[assetId]
		);
		const started = performance.now();
		const readings = new Float64Array(perMember);
		let label = 0;
		for (const t of TYPES)
			for (const c of CLASSES) {
				const rows: unknown[] = [];
				const specs: unknown[] = [];
				for (let m = 0; m < MEMBERS_PER_GROUP; m++) {
					// Every tenth group has one low member (a low patch), so some mixtures are real.
					const centre = m === 0 && label % 100 === 0 ? 36 : 45;
					for (let i = 0; i < perMember; i++)
						readings[i] = Math.max(1, Math.round((centre + 7 * z()) * 10)) / 10;
					const counts = encodeCounts(countedFromGridReadings(readings, GRID));
					specs.push(surveyId, assetId, `M${++label}`, t, c);
					rows.push(
						perMember,
						counts.grid!.den,
						counts.grid!.factor,
						counts.distinct,
						counts.bytes
					);
				}
				const ids: number[] = [];
				for (let m = 0; m < MEMBERS_PER_GROUP; m++) {
					const [id] = await q(
						"INSERT INTO members (survey_id, asset_id, label, member_type, face, exposure_class, requirement_source, c_min_mm, c_nom_mm, delta_c_dev_mm, created_at, updated_at) VALUES (?, ?, ?, ?, 'top', ?, 'EN 1992-1-1', 35, 45, 10, NOW(), NOW())",
						specs.slice(m * 5, m * 5 + 5)
					);
					ids.push(id as number);
				}
				await q(
					`INSERT INTO member_cover_sets (member_id, reading_count, grid_den, grid_factor, distinct_covers, cover_counts) VALUES ${ids.map(() => '(?, ?, ?, ?, ?, ?)').join(', ')}`,
					ids.flatMap((id, m) => [id, ...rows.slice(m * 5, m * 5 + 5)])
				);
			}
		console.log(
			`${(100 * MEMBERS_PER_GROUP * perMember).toLocaleString('en')} readings as 1,000 members' counts: generated and stored in ${((performance.now() - started) / 1000).toFixed(1)} s`
		);
		return assetId as number;
	}

	/** numpy's per-group figures on the same merged counts, timed in Python (median of 5). */
	function peer(groups: { sample: { values: Float64Array; counts: Float64Array } }[]) {
		const dir = mkdtempSync(join(tmpdir(), 'pages-peer-'));
		try {
			const file = join(dir, 'groups.json');
			writeFileSync(
				file,
				JSON.stringify(
					groups.map((g) => ({
						values: Array.from(g.sample.values),
						counts: Array.from(g.sample.counts)
					}))
				)
			);
			return JSON.parse(execFileSync('python3', [PEER, file], { encoding: 'utf8' })) as {
				runsMs: number[];
				numpy: string;
			};
		} finally {
			rmSync(dir, { recursive: true, force: true });
		}
	}

	async function report(assetId: number, readings: number) {
		const coldStart = performance.now();
		const check = await populationOverview({ assetId, split: 'none', choice });
		console.log(
			`overview of ${readings.toLocaleString('en')}, first view (cold): ${(performance.now() - coldStart).toFixed(0)} ms`
		);
		const total = check.populations.reduce((s, p) => s + (p.assessment?.description.n ?? 0), 0);
		if (check.populations.length !== 100 || total !== readings)
			throw new Error(`bench data wrong: ${check.populations.length} groups, ${total} readings`);
		console.log(
			`load average before: ${loadavg()
				.map((x) => x.toFixed(1))
				.join(' ')}`
		);
		const overview = await time(() => populationOverview({ assetId, split: 'none', choice }));
		console.log(
			`overview, ${readings.toLocaleString('en')} readings in 100 groups: ${fmt(overview)}`
		);
		const gathering = await time(() => gatherGroups({ assetId }, 'none'));
		console.log(`  of which reading and merging the counts: ${fmt(gathering)}`);
		const groups = await gatherGroups({ assetId }, 'none');
		const engine = await time(() => groups.map((g) => judgeGroup(g, choice, false)));
		console.log(`  of which the engine (100 counted assessments): ${fmt(engine)}`);
		const numpy = peer(groups);
		console.log(
			`  peer, numpy ${numpy.numpy} on the same counts (n, mean, SD, P5/P50/P95, share below): ${fmt(numpy.runsMs)}`
		);
		console.log(
			`load average after: ${loadavg()
				.map((x) => x.toFixed(1))
				.join(' ')}`
		);
		return groups;
	}

	const million = await stock(1_000);
	await report(million, 1_000_000);
	// The overview with every group's member test and mixture, as one request would compute them:
	// the mixture through the product's rule (populationMixture: fitted only where neither model
	// fits the group, as the detail page does), and, for comparison, fitted on every group.
	let fitted = 0;
	const full = await time(async () => {
		const groups = await gatherGroups({ assetId: million }, 'none');
		fitted = 0;
		return groups.map((g) => {
			const result = judgeGroup(g, choice, false);
			const mixture = populationMixture(g, result.assessment);
			if (mixture) fitted++;
			return { result, members: memberComparison(g), mixture };
		});
	});
	console.log(
		`overview of 1,000,000 readings with every group's member test, and the mixture where neither model fits (${fitted} of 100 groups): ${fmt(full)}`
	);
	const everyGroup = await time(async () => {
		const groups = await gatherGroups({ assetId: million }, 'none');
		return groups.map((g) => ({
			result: judgeGroup(g, choice, false),
			members: memberComparison(g),
			mixture: fitNormalMixtureCounted(g.sample, { seed: 1 })
		}));
	});
	console.log(`  … with a mixture fitted on every group: ${fmt(everyGroup)}`);
	// 100,000 readings in one population: the deck members of ten classes moved into one.
	await sequelize.query(
		"UPDATE members SET exposure_class = 'BIG' WHERE asset_id = ? AND member_type = 'deck' AND exposure_class IN (?)",
		{ replacements: [million, CLASSES.slice(0, 10)], type: QueryTypes.UPDATE }
	);
	const one = await populationDetail(
		{ assetId: million, choice },
		{ type: 'deck', exposure: 'BIG' }
	);
	if (one?.result.assessment?.description.n !== 100_000)
		throw new Error('bench detail is not 100,000 readings');
	const detail = await time(() =>
		populationDetail({ assetId: million, choice }, { type: 'deck', exposure: 'BIG' })
	);
	console.log(`detail, 100,000 readings with chart data: ${fmt(detail)}`);
	const members = await time(() => memberComparison(one.group));
	console.log(`  + members compared (${one.group.members.length} members): ${fmt(members)}`);
	const mixture = await time(() => fitNormalMixtureCounted(one.group.sample, { seed: 1 }));
	console.log(`  + two-component mixture by EM: ${fmt(mixture)}`);

	const tenMillion = await stock(10_000);
	await report(tenMillion, 10_000_000);

	await sequelize.query(
		'DELETE FROM member_cover_sets WHERE member_id IN (SELECT id FROM members WHERE asset_id IN (:assets))',
		{ replacements: { assets }, type: QueryTypes.DELETE }
	);
	await sequelize.query('DELETE FROM members WHERE asset_id IN (:assets)', {
		replacements: { assets },
		type: QueryTypes.DELETE
	});
	await sequelize.query('DELETE FROM surveys WHERE asset_id IN (:assets)', {
		replacements: { assets },
		type: QueryTypes.DELETE
	});
	await sequelize.query('DELETE FROM assets WHERE id IN (:assets)', {
		replacements: { assets },
		type: QueryTypes.DELETE
	});
	await sequelize.query('DELETE FROM organisations WHERE id = ?', {
		replacements: [orgId],
		type: QueryTypes.DELETE
	});
	await closeDb();
});
