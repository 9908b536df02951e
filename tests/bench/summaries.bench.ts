/**
 * Research statistics over a large stock, read from the members' cover counts.
 * `npm run bench:summaries -- [readings] [structures]` (defaults 10^7 and 1,000): generates the
 * readings straight into MariaDB with its sequence engine (seq_1_to_N, 10 members a structure,
 * covers on a 0.1 mm grid), builds every member's summaries as an import does
 * (rebuildCoverSets: cover set and counts), then times the service call behind
 * GET /api/v1/research/statistics (grouped by member type and exposure, no charts) and the
 * process's peak RSS. Prints generation time and the tables' size on disk. Runs against the
 * test database named in .env.test (FRACTILE_ENV_FILE); drop it after (bash scripts/db.sh recreate test).
 */
import { QueryTypes } from 'sequelize';
import { createSequelize, readDatabaseSettings } from '../../src/lib/server/db/connection';
import { Asset, initModels, Member, Organisation, Survey } from '../../src/lib/server/db/models';
import { rebuildCoverSets } from '../../src/lib/server/readings/coverSets';
import { researchFilterSchema } from '../../src/lib/server/research/filter';
import { researchStatistics } from '../../src/lib/server/research/statistics';
import { loadProjectEnv } from '../../scripts/env';

loadProjectEnv();
const args = process.argv.slice(2).filter((a) => !a.startsWith('--'));
/** --reuse: time the statistics on the stock a previous run generated (no generation). */
const REUSE = process.argv.includes('--reuse');
const READINGS = Number(args[0] ?? 10_000_000);
const STRUCTURES = Number(args[1] ?? 1_000);
const MEMBERS_PER_STRUCTURE = 10;
const RUNS = 5;

const sequelize = createSequelize({
	...readDatabaseSettings(process.env),
	DB_QUERY_TIMEOUT_MS: 3_600_000
});
initModels(sequelize);

const seconds = (since: number) => ((performance.now() - since) / 1000).toFixed(1);
const mb = (bytes: number) => (bytes / 2 ** 20).toFixed(0);

async function generate(): Promise<number[]> {
	const owner = await Organisation.create({ name: 'Stock owner', slug: `stock-${Date.now()}` });
	const memberIds: number[] = [];
	for (let s = 0; s < STRUCTURES; s++) {
		const asset = await Asset.create({
			organisationId: owner.id,
			name: `Structure ${s}`,
			locationText: null,
			yearOfConstruction: 1960 + (s % 60),
			designCode: 'EN 1992-1-1',
			designServiceLifeYears: 50,
			researchOptIn: true
		});
		const survey = await Survey.create({
			assetId: asset.id,
			title: `Survey ${s}`,
			surveyDate: '2025-01-01',
			surveyorUserId: null,
			surveyorName: null,
			meterMake: null,
			meterSerial: null,
			meterCalibration: null,
			status: 'submitted'
		});
		const members = await Member.bulkCreate(
			Array.from({ length: MEMBERS_PER_STRUCTURE }, (_, i) => ({
				surveyId: survey.id,
				assetId: asset.id,
				label: `M${i}`,
				memberType: (['slab', 'beam', 'column', 'wall', 'deck'] as const)[i % 5],
				face: 'bottom' as const,
				exposureClass: ['XC1', 'XC3', 'XC4', 'XD1'][(s + i) % 4],
				requirementSource: 'EN 1992-1-1' as const,
				structuralClass: 'S4',
				cMinMm: 25,
				cNomMm: 35,
				deltaCDevMm: 10,
				deltaPlusMm: null,
				barDiameterMm: 12,
				barSpacingMm: null,
				spacingToleranceMm: null,
				memberDepthMm: 250,
				gridWidthMm: 5000,
				gridHeightMm: 5000
			}))
		);
		memberIds.push(...members.map((m) => m.id));
	}
	memberIds.sort((a, b) => a - b);
	// Member ids are consecutive per run (one bulk insert a structure, nothing else writing).
	const first = memberIds[0];
	if (memberIds[memberIds.length - 1] - first !== memberIds.length - 1)
		throw new Error('the benchmark needs consecutive member ids (run it on an idle database)');
	// A bell of covers on a 0.1 mm grid: 20 mm plus three hashed 0–19.9 mm parts (about 600
	// distinct values, several hundred in each member).
	const CHUNK = 5_000_000;
	for (let start = 0; start < READINGS; start += CHUNK) {
		const size = Math.min(CHUNK, READINGS - start);
		await sequelize.query(
			`INSERT INTO readings (member_id, x_mm, y_mm, cover_mm, bar_diameter_mm, flags)
			 SELECT :first + (s.seq % :members), (s.seq % 97) * 50, (FLOOR(s.seq / 97) % 100) * 50,
			        20 + (CRC32(s.seq) % 200 + CRC32(s.seq * 7 + 1) % 200 + CRC32(s.seq * 13 + 5) % 200) / 10,
			        12, 0
			   FROM (SELECT seq + :start AS seq FROM seq_1_to_${size}) s`,
			{ type: QueryTypes.INSERT, replacements: { first, members: memberIds.length, start } }
		);
	}
	return memberIds;
}

let memberIds: number[];
if (REUSE) {
	const rows = await sequelize.query<{ id: number }>('SELECT id FROM members', {
		type: QueryTypes.SELECT
	});
	memberIds = rows.map((r) => r.id);
} else {
	const generationStart = performance.now();
	memberIds = await generate();
	const generated = seconds(generationStart);
	const summariesStart = performance.now();
	for (let i = 0; i < memberIds.length; i += 100)
		await sequelize.transaction((t) => rebuildCoverSets(t, memberIds.slice(i, i + 100)));
	const summarised = seconds(summariesStart);
	const [size] = await sequelize.query<{
		readings: number;
		summaries: number;
		countsBytes: number;
	}>(
		`SELECT
		   (SELECT data_length + index_length FROM information_schema.tables WHERE table_schema = DATABASE() AND table_name = 'readings') AS readings,
		   (SELECT data_length + index_length FROM information_schema.tables WHERE table_schema = DATABASE() AND table_name = 'member_cover_sets') AS summaries,
		   (SELECT SUM(LENGTH(cover_counts)) FROM member_cover_sets) AS countsBytes`,
		{ type: QueryTypes.SELECT }
	);
	console.log(
		`generated ${READINGS} readings in ${STRUCTURES} structures (${memberIds.length} members): ` +
			`rows ${generated} s, summaries ${summarised} s; on disk readings ${mb(size.readings)} MB, ` +
			`summary rows ${mb(size.summaries)} MB (counts alone ${mb(Number(size.countsBytes))} MB, ` +
			`${(Number(size.countsBytes) / memberIds.length).toFixed(0)} bytes a member)`
	);
}

const filter = researchFilterSchema.parse({});
const rssBefore = process.memoryUsage().rss;
const times: number[] = [];
let readingCount = 0;
for (let run = 0; run < RUNS; run++) {
	const t0 = performance.now();
	const stats = await researchStatistics(sequelize, 'bench-secret', filter, {
		groupBy: ['memberType', 'exposureClass']
	});
	times.push(performance.now() - t0);
	readingCount = stats.selection.readingCount;
}
times.sort((a, b) => a - b);
console.log(
	`research statistics over ${readingCount} readings, ${memberIds.length} members, 20 groups: ` +
		`median ${times[RUNS >> 1].toFixed(0)} ms (min ${times[0].toFixed(0)}, max ${times[RUNS - 1].toFixed(0)}); ` +
		`RSS before ${mb(rssBefore)} MB, peak ${mb(process.resourceUsage().maxRSS * 1024)} MB`
);
await sequelize.close();
