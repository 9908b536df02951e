/**
 * `npm run bench:import`: a generated 1,000,000-row CSV through the built app over HTTP (upload
 * staged with sha256 → detect and preview → validate every row → batched INSERTs in one
 * transaction, progress polled), against MariaDB's own LOAD DATA LOCAL INFILE of the same rows, on the development database.
 * Prints rows/s, the ratio and the importing process's peak RSS. Not a test: no assertions.
 */
import { createWriteStream } from 'node:fs';
import { readFile } from 'node:fs/promises';
import { mkdir, rm } from 'node:fs/promises';
import { once } from 'node:events';
import { join } from 'node:path';
import { cpus, loadavg } from 'node:os';
import mariadb from 'mariadb';
import { QueryTypes } from 'sequelize';
import { loadProjectEnv } from '../../scripts/env';
import { createSequelize, readDatabaseSettings } from '../../src/lib/server/db/connection';
import { ImportBatch, initModels, Member, Reading, Survey } from '../../src/lib/server/db/models';
import { actorFor, freshSurvey } from '../helpers/intake';
import { startBuiltApp } from '../helpers/server';
import { DEMO_PASSWORD, signIn } from '../helpers/session';

const ROWS = Number(process.env.BENCH_ROWS ?? 1_000_000);
/**
 * BENCH_COLUMNS=all adds bar diameter, bar spacing, direction or layer and a note to every row
 * (a meter export with everything filled); the default is member, x, y and cover.
 */
const ALL_COLUMNS = process.env.BENCH_COLUMNS === 'all';
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
const extras = (i: number) => [
	[10, 12, 16, 20][i % 4],
	150 + (i % 3) * 50,
	i % 2 ? 'top' : 'bottom',
	i % 10 === 0 ? `scan ${i % 97}` : ''
];

/**
 * Waits until InnoDB has purged what earlier runs deleted (the history list is short), so a
 * run is not timed against the previous run's cleanup.
 */
async function waitForPurge() {
	for (let i = 0; i < 120; i++) {
		const [row] = await sequelize.query<{ n: number }>(
			"SELECT `count` AS n FROM information_schema.INNODB_METRICS WHERE name = 'trx_rseg_history_len'",
			{ type: QueryTypes.SELECT }
		);
		if (Number(row?.n ?? 0) < 1000) return;
		await new Promise((r) => setTimeout(r, 1000));
	}
}

loadProjectEnv();
const settings = readDatabaseSettings(process.env);
const sequelize = createSequelize(settings);
initModels(sequelize);
await mkdir(dir, { recursive: true });

const actor = await actorFor('surveyor@kestrel-lane.example');
const labels = Array.from({ length: MEMBERS }, (_, i) => label(i));
const { survey, members } = await freshSurvey(actor, labels);
const csvPath = join(dir, 'readings-1m.csv');
await writeLines(
	csvPath,
	'Member,X (mm),Y (mm),Cover (mm)' + (ALL_COLUMNS ? ',Bar (mm),Spacing (mm),Layer,Note' : ''),
	(i) =>
		`${label(i)},${xMm(i)},${yMm(i)},${coverMm(i)}${ALL_COLUMNS ? `,${extras(i).join(',')}` : ''}`
);
console.log(
	`generated ${ROWS} rows (${ALL_COLUMNS ? 'all eight fields' : 'member, x, y, cover'}) in ${csvPath}`
);

// The app's import path, end to end: the built app over HTTP, as the import page uses it.
const app = await startBuiltApp({
	IMPORT_STAGING_DIR: join(dir, 'staging'),
	BODY_SIZE_LIMIT: '64M'
});
const client = await signIn('surveyor@kestrel-lane.example', DEMO_PASSWORD, app.origin);
const headers = { cookie: client.cookie, origin: app.origin, accept: 'application/json' };
const fileBytes = await readFile(csvPath);
/** VmRSS of the app process now, in MB (proc(5)). */
async function appRssMb(): Promise<number> {
	const status = await readFile(`/proc/${app.pid}/status`, 'utf8');
	return Number(/VmRSS:\s+(\d+) kB/.exec(status)?.[1] ?? 0) / 1024;
}
const rssBefore = await appRssMb();
await waitForPurge();
let started = performance.now();
const uploaded = await fetch(
	`${app.origin}/api/v1/surveys/${survey.id}/imports?fileName=readings-1m.csv`,
	{
		method: 'POST',
		headers: { ...headers, 'content-type': 'text/csv' },
		body: new Uint8Array(fileBytes)
	}
);
const upload = await uploaded.json();
if (uploaded.status !== 201) throw new Error(`upload refused: ${JSON.stringify(upload)}`);
const { mixedDecimalMarks: _mixed, ...detected } = upload.preview.settings;
const rssAfterUpload = await appRssMb();
const uploadSeconds = (performance.now() - started) / 1000;
let rssDuringImport = 0;
const sampler = setInterval(
	() => void appRssMb().then((mb) => (rssDuringImport = Math.max(rssDuringImport, mb))),
	100
);
const start = await client.postJson(`/api/v1/imports/${upload.batchId}/start`, {
	mapping: {
		memberLabel: 0,
		x: 1,
		y: 2,
		cover: 3,
		...(ALL_COLUMNS ? { diameter: 4, spacing: 5, direction: 6, note: 7 } : {})
	},
	options: detected,
	confirmDuplicate: true
});
if (start.status !== 202) throw new Error(`start refused: ${await start.text()}`);
let status: { state: string; errorMessage: string | null; progress: { fraction: number } | null };
let polls = 0;
for (;;) {
	status = (await (await client.get(`/api/v1/imports/${upload.batchId}`)).json()).import;
	if (status.state !== 'running') break;
	polls++;
	await new Promise((r) => setTimeout(r, 100));
}
const appSeconds = (performance.now() - started) / 1000;
clearInterval(sampler);
console.log(`app import: ${status.state} after ${appSeconds.toFixed(1)} s`);
// VmHWM: the app process's peak resident set since it started (proc(5)).
const procStatus = await readFile(`/proc/${app.pid}/status`, 'utf8');
const peakRssMb = Number(/VmHWM:\s+(\d+) kB/.exec(procStatus)?.[1] ?? 0) / 1024;
// The server may keep idle keep-alive sockets open after SIGTERM; the figures are taken, so end it.
await Promise.race([app.stop(), new Promise((r) => setTimeout(r, 3000))]);
try {
	process.kill(app.pid!, 'SIGKILL');
} catch {
	// already gone
}
console.log('app stopped; LOAD DATA of the same rows next');
if (status.state !== 'completed')
	throw new Error(`the import did not complete: ${status.errorMessage}`);

// The same rows as the readings table holds them, for LOAD DATA (its file written untimed).
const idOf = new Map(members.map((m) => [m.label, m.id]));
const tsvPath = join(dir, 'readings-1m.tsv');
await writeLines(
	tsvPath,
	null,
	(i) =>
		`${idOf.get(label(i))}\t${xMm(i)}\t${yMm(i)}\t${coverMm(i)}` +
		(ALL_COLUMNS
			? `\t${extras(i)
					.map((v) => (v === '' ? '\\N' : v))
					.join('\t')}`
			: '')
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
	`LOAD DATA LOCAL INFILE ? INTO TABLE readings FIELDS TERMINATED BY '\\t' (member_id, x_mm, y_mm, cover_mm${ALL_COLUMNS ? ', bar_diameter_mm, bar_spacing_mm, bar_direction, note' : ''}) SET import_batch_id = ?, flags = 0`,
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
console.log(
	`  of which the upload (staged with its sha256 and stored): ${uploadSeconds.toFixed(2)} s`
);
console.log(`ratio app / LOAD DATA:  ${(appSeconds / loadSeconds).toFixed(2)} (target ≤ 2)`);
console.log(
	`peak RSS of the app process (VmHWM): ${peakRssMb.toFixed(0)} MB (target < 300 MB); progress polled ${polls} times`
);
console.log(
	`app RSS: ${rssBefore.toFixed(0)} MB idle after sign-in, ${rssAfterUpload.toFixed(0)} MB after the upload, sampled peak ${rssDuringImport.toFixed(0)} MB while importing`
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
