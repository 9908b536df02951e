/**
 * `npm run bench:import`: a generated 1,000,000-row CSV through the app's import path (stage
 * with sha256 → detect and preview → validate every row → batched INSERTs in one transaction),
 * against MariaDB's own LOAD DATA LOCAL INFILE of the same rows, on the development database.
 * Prints rows/s, the ratio and the importing process's peak RSS. Not a test: no assertions.
 */
import { createReadStream, createWriteStream } from 'node:fs';
import { mkdir, rm } from 'node:fs/promises';
import { once } from 'node:events';
import { join } from 'node:path';
import { cpus, loadavg } from 'node:os';
import mariadb from 'mariadb';
import { loadProjectEnv } from '../../scripts/env';
import { createSequelize, readDatabaseSettings } from '../../src/lib/server/db/connection';
import { ImportBatch, initModels, Member, Reading, Survey } from '../../src/lib/server/db/models';
import { receiveUpload, startImport } from '../../src/lib/server/import/batches';
import { importOptionsSchema, columnMappingSchema } from '../../src/lib/server/import/mapping';
import { actorFor, freshSurvey } from '../helpers/intake';

const ROWS = Number(process.env.BENCH_ROWS ?? 1_000_000);
const MEMBERS = 100;
const dir = join(process.cwd(), '.local', 'bench');

/** Writes lines through a stream with back-pressure, so the file is never held in memory. */
async function writeLines(path: string, header: string | null, line: (i: number) => string) {
	const out = createWriteStream(path);
	if (header) out.write(header + '\n');
	for (let i = 0; i < ROWS; i++) {
		if (!out.write(line(i) + '\n')) await once(out, 'drain');
	}
	out.end();
	await once(out, 'finish');
}

const label = (i: number) => `B-${String(1 + (i % MEMBERS)).padStart(3, '0')}`;
const coverMm = (i: number) => (20 + ((i * 7919) % 400) / 10).toFixed(1);
const xMm = (i: number) => (Math.floor(i / MEMBERS) % 1000) * 10;
const yMm = (i: number) => Math.floor(i / (MEMBERS * 1000)) * 10;

loadProjectEnv();
const settings = readDatabaseSettings(process.env);
const sequelize = createSequelize(settings);
initModels(sequelize);
await mkdir(dir, { recursive: true });
process.env.IMPORT_STAGING_DIR ??= join(dir, 'staging');

const actor = await actorFor('surveyor@kestrel-lane.example');
const labels = Array.from({ length: MEMBERS }, (_, i) => label(i));
const { survey, members } = await freshSurvey(actor, labels);
const csvPath = join(dir, 'readings-1m.csv');
await writeLines(
	csvPath,
	'Member,X (mm),Y (mm),Cover (mm)',
	(i) => `${label(i)},${xMm(i)},${yMm(i)},${coverMm(i)}`
);
console.log(`generated ${ROWS} rows in ${csvPath}`);

// The app's import path, end to end.
const rssBeforeMb = process.memoryUsage().rss / 1024 / 1024;
let started = performance.now();
const upload = await receiveUpload(actor, survey.id, 'readings-1m.csv', createReadStream(csvPath));
const { mixedDecimalMarks: _mixed, ...detected } = upload.preview.settings;
const run = await startImport(actor, upload.batchId, {
	mapping: columnMappingSchema.parse({ memberLabel: 0, x: 1, y: 2, cover: 3 }),
	options: importOptionsSchema.parse(detected),
	confirmDuplicate: true,
	saveTemplateAs: null
});
const outcome = await run.done;
const appSeconds = (performance.now() - started) / 1000;
const peakRssMb = process.resourceUsage().maxRSS / 1024;
if (outcome.state !== 'completed')
	throw new Error(`the import did not complete: ${outcome.message}`);

// The same rows as the readings table holds them, for LOAD DATA (its file written untimed).
const idOf = new Map(members.map((m) => [m.label, m.id]));
const tsvPath = join(dir, 'readings-1m.tsv');
await writeLines(
	tsvPath,
	null,
	(i) => `${idOf.get(label(i))}\t${xMm(i)}\t${yMm(i)}\t${coverMm(i)}`
);
const loadBatch = await ImportBatch.create({
	surveyId: survey.id,
	createdByUserId: actor.userId,
	sourceFormat: 'csv'
});
const connection = await mariadb.createConnection({
	host: settings.DB_HOST,
	port: settings.DB_PORT,
	user: settings.DB_USER,
	password: settings.DB_PASSWORD,
	database: settings.DB_NAME,
	permitLocalInfile: true
});
started = performance.now();
await connection.beginTransaction();
await connection.query(
	`LOAD DATA LOCAL INFILE ? INTO TABLE readings FIELDS TERMINATED BY '\\t' (member_id, x_mm, y_mm, cover_mm) SET import_batch_id = ?, flags = 0`,
	[tsvPath, loadBatch.id]
);
await connection.commit();
const loadSeconds = (performance.now() - started) / 1000;
await connection.end();

const appRate = ROWS / appSeconds;
console.log(
	`app import path:        ${appSeconds.toFixed(2)} s, ${Math.round(appRate).toLocaleString('en')} rows/s`
);
console.log(
	`LOAD DATA LOCAL INFILE: ${loadSeconds.toFixed(2)} s, ${Math.round(ROWS / loadSeconds).toLocaleString('en')} rows/s`
);
console.log(`ratio app / LOAD DATA:  ${(appSeconds / loadSeconds).toFixed(2)} (target ≤ 2)`);
console.log(
	`peak RSS of the importing process: ${peakRssMb.toFixed(0)} MB (target < 300 MB; ${rssBeforeMb.toFixed(0)} MB before the import)`
);
console.log(
	`machine: ${cpus().length} cores, load average ${loadavg()
		.map((l) => l.toFixed(1))
		.join(' ')}`
);

// Leave the development database as it was.
const memberIds = members.map((m) => m.id);
for (;;) {
	const gone = await Reading.destroy({ where: { memberId: memberIds }, limit: 100_000 });
	if (gone === 0) break;
}
await ImportBatch.destroy({ where: { surveyId: survey.id } });
await Member.destroy({ where: { surveyId: survey.id } });
await Survey.destroy({ where: { id: survey.id } });
await rm(dir, { recursive: true, force: true });
await sequelize.close();
