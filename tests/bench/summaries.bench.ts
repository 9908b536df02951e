/**
 * Research statistics over a large stock, read from the members' cover counts.
 * `npm run bench:summaries -- [readings] [structures] [members a structure]` (defaults 10^7,
 * 1,000 and 100): generates the readings straight into MariaDB with its sequence engine
 * (seq_1_to_N, covers on a 0.1 mm grid), builds every member's summary row (reading count and
 * cover counts) by SQL with the bytes the app writes, then times the service call behind
 * GET /api/v1/research/statistics (grouped by member type and exposure, no charts) and the
 * process's peak RSS. Prints generation time and the tables' size on disk. Runs against the
 * test database named in .env.test (FRACTILE_ENV_FILE); drop it after (bash scripts/db.sh recreate test).
 */
import { execFileSync } from 'node:child_process';
import { statfsSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { QueryTypes, type Transaction } from 'sequelize';
import { createSequelize, readDatabaseSettings } from '../../src/lib/server/db/connection';
import { Asset, initModels, Member, Organisation, Survey } from '../../src/lib/server/db/models';
import { gridCountsBuffer, readGridCounts } from '../../src/lib/server/readings/coverCountCodec';
import { researchFilterSchema } from '../../src/lib/server/research/filter';
import { researchStatistics } from '../../src/lib/server/research/statistics';
import { loadProjectEnv } from '../../scripts/env';

loadProjectEnv();
const args = process.argv.slice(2).filter((a) => !a.startsWith('--'));
/** --reuse: time the statistics on the stock a previous run generated (no generation). */
const REUSE = process.argv.includes('--reuse');
/** --resume: generate the rest of a stock whose generation stopped part-way. */
const RESUME = process.argv.includes('--resume');
/**
 * --rows-only: generate the readings and stop; --summaries-only: build the summaries of a stock
 * generated that way (both resume where they stopped). The default writes both per batch.
 */
const PHASE = process.argv.includes('--rows-only')
	? 'rows'
	: process.argv.includes('--summaries-only')
		? 'summaries'
		: 'both';
const READINGS = Number(args[0] ?? 10_000_000);
const STRUCTURES = Number(args[1] ?? 1_000);
const MEMBERS_PER_STRUCTURE = Number(args[2] ?? 100);
const RUNS = 5;

const sequelize = createSequelize({
	...readDatabaseSettings(process.env),
	DB_QUERY_TIMEOUT_MS: 3_600_000
});
initModels(sequelize);

const seconds = (since: number) => ((performance.now() - since) / 1000).toFixed(1);
const mb = (bytes: number) => (bytes / 2 ** 20).toFixed(0);

/** Structures, surveys and members, 100 members a structure by default; returns member ids. */
async function createMembers(): Promise<number[]> {
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
				face: (['bottom', 'top', 'side'] as const)[Math.floor(i / 5) % 3],
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
	return memberIds;
}

/**
 * A whole number below 2^21 as the codec's LEB128 varint (readings/coverCountCodec.ts), in SQL:
 * the generated stock's steps (ZigZag of 200–1,000: first steps are never negative here) and
 * counts stay far below it. `npm run db:check-summaries` on a small run compares the bytes with
 * what the app writes.
 */
const varintSql = (v: string) =>
	`IF(${v} < 128, CHAR(${v} USING binary), IF(${v} < 16384,
	   CONCAT(CHAR(128 + ${v} % 128 USING binary), CHAR(${v} DIV 128 USING binary)),
	   CONCAT(CHAR(128 + ${v} % 128 USING binary), CHAR(128 + (${v} DIV 128) % 128 USING binary), CHAR(${v} DIV 16384 USING binary))))`;

/**
 * The readings straight from the sequence engine with explicit ids, in primary-key order
 * (member, id) so every batch appends to the clustered index, and each batch's summaries built
 * at once by GROUP BY while its rows are still in the buffer pool — the same bytes an import
 * writes (checked by `npm run db:check-summaries` on a small run). Covers are whole steps k of
 * 0.1 mm: 20 mm, a member's own shift of 0–9.9 mm and three hashed parts of 0–13.3 mm (a bell of
 * about 500 values, some 350 distinct in a member of 1,000 readings).
 */
async function generateReadings(memberIds: number[]) {
	const first = memberIds[0];
	if (memberIds[memberIds.length - 1] - first !== memberIds.length - 1)
		throw new Error('the benchmark needs consecutive member ids (run it on an idle database)');
	const perMember = Math.floor(READINGS / memberIds.length);
	if (perMember * memberIds.length !== READINGS)
		throw new Error(`${READINGS} readings do not split evenly over ${memberIds.length} members`);
	// --resume: carry on after the last member whose batch committed (a batch is one transaction).
	const [{ maxId, lastMember, lastRowMember }] = await sequelize.query<{
		maxId: number | null;
		lastMember: number | null;
		lastRowMember: number | null;
	}>(
		`SELECT (SELECT MAX(id) FROM readings) AS maxId, (SELECT MAX(member_id) FROM member_cover_sets) AS lastMember,
		        (SELECT MAX(member_id) FROM readings) AS lastRowMember`,
		{ type: QueryTypes.SELECT }
	);
	const last = PHASE === 'rows' ? lastRowMember : lastMember;
	const done = (RESUME || PHASE === 'summaries') && last !== null ? Number(last) - first + 1 : 0;
	const idBase = Number(maxId ?? 0) - done * perMember;
	const raw = (sql: string, replacements?: Record<string, number>, transaction?: Transaction) =>
		sequelize.query(sql, { type: QueryTypes.RAW, transaction, replacements });
	const membersPerBatch = Math.max(1, Math.floor(2_000_000 / perMember));
	let rowsMs = 0;
	let summariesMs = 0;
	for (let m = done; m < memberIds.length; m += membersPerBatch) {
		const members = Math.min(membersPerBatch, memberIds.length - m);
		const size = members * perMember;
		const start = m * perMember;
		// A batch's readings and their summaries in one transaction, as an import writes them;
		// the session settings of a bulk load (no per-row unique or foreign-key checks).
		await sequelize.transaction(async (t) => {
			await raw(
				'SET SESSION unique_checks = 0, foreign_key_checks = 0, group_concat_max_len = 1073741824',
				undefined,
				t
			);
			const t0 = performance.now();
			if (PHASE !== 'summaries')
				await raw(
					`INSERT INTO readings (id, member_id, x_mm, y_mm, cover_mm, bar_diameter_mm, flags)
				 SELECT :idBase + seq, member, ((seq - 1) % 97) * 50, (FLOOR((seq - 1) / 97) % 100) * 50, k / 10, 12, 0
				   FROM (SELECT seq, member,
				                200 + CRC32(member) % 100 + CRC32(seq) % 134 + CRC32(seq * 7 + 1) % 134 + CRC32(seq * 13 + 5) % 134 AS k
				           FROM (SELECT seq + :start AS seq, :first + (seq + :start - 1) DIV :perMember AS member
				                   FROM seq_1_to_${size}) s) r`,
					{ idBase, start, first, perMember },
					t
				);
			const t1 = performance.now();
			if (PHASE !== 'rows')
				await raw(
					`INSERT INTO member_cover_sets (member_id, reading_count, grid_den, grid_factor, distinct_covers, cover_counts)
				 SELECT c.member_id, SUM(c.n), 10, 1, COUNT(*),
				        GROUP_CONCAT(${varintSql('c.gap')}, ${varintSql('c.n')} ORDER BY c.k SEPARATOR '')
				   FROM (SELECT member_id, k, n, IF(prev IS NULL, 2 * k, k - prev - 1) AS gap
				           FROM (SELECT member_id, k, n, LAG(k) OVER (PARTITION BY member_id ORDER BY k) AS prev
				                   FROM (SELECT member_id, CAST(ROUND(cover_mm * 10) AS SIGNED) AS k, COUNT(*) AS n FROM readings
				                          WHERE member_id BETWEEN :lo AND :hi GROUP BY member_id, k) g) w) c
				  GROUP BY c.member_id`,
					{ lo: memberIds[m], hi: memberIds[m + members - 1] },
					t
				);
			rowsMs += t1 - t0;
			summariesMs += performance.now() - t1;
		});
		console.log(
			`  ${m + members} of ${memberIds.length} members: rows ${(rowsMs / 1000).toFixed(0)} s, summaries ${(summariesMs / 1000).toFixed(0)} s`
		);
	}
	// Later app writes take ids after the generated ones.
	if (PHASE !== 'summaries') await raw(`SELECT SETVAL(reading_ids, ${idBase + READINGS})`);
	console.log(
		`rows ${(rowsMs / 1000).toFixed(1)} s, summaries ${(summariesMs / 1000).toFixed(1)} s`
	);
}

/** The tables' size on disk (statistics refreshed first) and the counts' bytes a member. */
async function printSizes() {
	await sequelize.query('ANALYZE TABLE readings, member_cover_sets');
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
		`on disk: readings ${mb(size.readings)} MB, summary rows ${mb(size.summaries)} MB ` +
			`(counts alone ${mb(Number(size.countsBytes))} MB, ` +
			`${(Number(size.countsBytes) / memberIds.length).toFixed(0)} bytes a member)`
	);
}

let memberIds: number[];
if (REUSE) {
	const rows = await sequelize.query<{ id: number }>('SELECT id FROM members', {
		type: QueryTypes.SELECT
	});
	memberIds = rows.map((r) => r.id);
} else if (RESUME || PHASE === 'summaries') {
	const rows = await sequelize.query<{ id: number }>('SELECT id FROM members ORDER BY id', {
		type: QueryTypes.SELECT
	});
	memberIds = rows.map((r) => r.id);
	const resumed = performance.now();
	await generateReadings(memberIds);
	console.log(`resumed generation: ${seconds(resumed)} s`);
} else {
	const disk = () => statfsSync(process.cwd()).bavail * statfsSync(process.cwd()).bsize;
	const freeBefore = disk();
	const generationStart = performance.now();
	memberIds = await createMembers();
	const membersMade = seconds(generationStart);
	await generateReadings(memberIds);
	const generated = seconds(generationStart);
	console.log(
		`generated ${READINGS} readings in ${STRUCTURES} structures (${memberIds.length} members): ` +
			`${generated} s in all (members ${membersMade} s); disk used ${mb(freeBefore - disk())} MB (df)`
	);
}
if (!REUSE) await printSizes();

if (PHASE === 'rows') {
	console.log('rows only: build the summaries with --summaries-only, then time them');
	await sequelize.close();
	process.exit(0);
}

const filter = researchFilterSchema.parse({});
const rssBefore = process.memoryUsage().rss;
const times: number[] = [];
let readingCount = 0;
for (let run = 0; run < RUNS; run++) {
	const t0 = performance.now();
	const stats = await researchStatistics(sequelize, filter, {
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

// The parts and a peer. (1) Reading the count rows alone: the same paged query the service runs,
// nothing done with the bytes. (2) numpy from the same counts, written once to a file: per
// group n, mean, SD and type 7 P5/P50/P95 of the covers (tests/bench/summaries_peer.py), its
// figures compared with ours.
const GROUP_OF = (type: string, exposure: string) => `${type}|${exposure}`;
const groupNames: string[] = [];
const file = join(process.cwd(), '.local', 'bench-counts.bin');
const readTimes: number[] = [];
const decoded = gridCountsBuffer();
for (let run = 0; run < 3; run++) {
	const parts: Buffer[] = [];
	const t0 = performance.now();
	let after = 0;
	for (;;) {
		const rows = await sequelize.query<{
			id: number;
			memberType: string;
			exposureClass: string;
			counts: Buffer | null;
			den: number | null;
			factor: number | null;
		}>(
			`SELECT STRAIGHT_JOIN m.id, m.member_type AS memberType, m.exposure_class AS exposureClass,
			        c.cover_counts AS counts, c.grid_den AS den, c.grid_factor AS factor
			   FROM members m JOIN surveys s ON s.id = m.survey_id JOIN assets a ON a.id = m.asset_id
			   LEFT JOIN member_cover_sets c ON c.member_id = m.id
			  WHERE a.research_opt_in = 1 AND s.status IN ('submitted', 'approved') AND m.id > :after
			  ORDER BY m.id LIMIT 1000`,
			{ type: QueryTypes.SELECT, replacements: { after } }
		);
		if (rows.length === 0) break;
		after = rows[rows.length - 1].id;
		if (run > 0) continue;
		for (const r of rows) {
			if (!r.counts || r.counts.length === 0) continue;
			// The peer reads whole 0.1 mm steps, the grid the generated stock is logged on.
			if (Number(r.den) !== 10 || Number(r.factor) !== 1)
				throw new Error(
					`member ${r.id} is not on the 0.1 mm grid: run the peer on a generated stock only`
				);
			const name = GROUP_OF(r.memberType, r.exposureClass);
			let g = groupNames.indexOf(name);
			if (g < 0) g = groupNames.push(name) - 1;
			// The peer's file keeps fixed entries (int32 step, uint32 count) for numpy to read.
			const entries = readGridCounts(r.counts, decoded);
			const fixed = Buffer.alloc(8 + entries * 8);
			fixed.writeInt32LE(g, 0);
			fixed.writeInt32LE(entries, 4);
			for (let i = 0; i < entries; i++) {
				fixed.writeInt32LE(decoded.steps[i], 8 + i * 8);
				fixed.writeUInt32LE(decoded.counts[i], 12 + i * 8);
			}
			parts.push(fixed);
		}
	}
	readTimes.push(performance.now() - t0);
	if (run === 0) writeFileSync(file, Buffer.concat(parts));
}
readTimes.sort((a, b) => a - b);
console.log(
	`reading the count rows alone (3 runs; the first also keeps them for the peer): median ${readTimes[1].toFixed(0)} ms, min ${readTimes[0].toFixed(0)} ms`
);
const peer = JSON.parse(
	execFileSync('python3', [join(import.meta.dirname, 'summaries_peer.py'), file, String(RUNS)], {
		encoding: 'utf8'
	})
) as {
	medianMs: number;
	minMs: number;
	groups: { g: number; n: number; mean: number; sd: number; p5: number }[];
};
const ours = await researchStatistics(sequelize, filter, {
	groupBy: ['memberType', 'exposureClass']
});
let worst = 0;
for (const p of peer.groups) {
	const [memberType, exposureClass] = groupNames[p.g].split('|');
	const g = ours.groups.find(
		(x) => x.key.memberType === memberType && x.key.exposureClass === exposureClass
	)!;
	if (g.readingCount !== p.n)
		throw new Error(`group ${groupNames[p.g]}: n ${g.readingCount} against numpy's ${p.n}`);
	const d = g.cover!.description;
	for (const [a, b] of [
		[d.meanMm, p.mean],
		[d.sdMm, p.sd],
		[g.cover!.percentiles[0].valueMm, p.p5]
	])
		worst = Math.max(worst, Math.abs(a - b) / Math.abs(b));
}
console.log(
	`numpy peer on the same counts from a file (figures only, no database): median ${peer.medianMs.toFixed(0)} ms, ` +
		`min ${peer.minMs.toFixed(0)} ms; ${peer.groups.length} groups, largest relative difference from ours ${worst.toExponential(1)}`
);
await sequelize.close();
