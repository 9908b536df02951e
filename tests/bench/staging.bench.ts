/**
 * `npm run bench:staging`: what keeping an upload in object storage adds to an import. A
 * generated 30 MB CSV is staged locally as an upload is (hashed, size-limited, written), then
 * stored with the import's own PUT, then read back whole from storage as a start on another
 * machine reads it. Needs the storage fake of the env file (FRACTILE_ENV_FILE, else .env)
 * running: `npm start`, or `bash scripts/services.sh start test` with FRACTILE_ENV_FILE=.env.test.
 * Prints each run and the medians. Not a test: no assertions.
 */
import { createReadStream, createWriteStream } from 'node:fs';
import { mkdtemp, rm } from 'node:fs/promises';
import { once } from 'node:events';
import { cpus, loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';
import { loadProjectEnv } from '../../scripts/env';
import { removeStaged, stageUpload } from '../../src/lib/server/import/stage';
import {
	openStaged,
	removeStagedCopies,
	storeStaged
} from '../../src/lib/server/import/stagedCopies';
import { closeStorage } from '../../src/lib/server/storage/s3';

const BYTES = Number(process.env.BENCH_BYTES ?? 30 * 1024 * 1024);
const RUNS = Number(process.env.BENCH_RUNS ?? 7);
// Far above any real batch id, so no stored upload of the instance is touched.
const FIRST_ID = 2_000_000_000;

/** A CSV of about BYTES, written with back-pressure. */
async function generate(path: string): Promise<void> {
	const out = createWriteStream(path);
	for (let i = 0; out.bytesWritten + out.writableLength < BYTES; i++) {
		const cover = (20 + ((i * 7919) % 400) / 10).toFixed(1);
		const line = `B-${String(1 + (i % 100)).padStart(3, '0')},${(i % 1000) * 10},${Math.floor(i / 1000) * 10},${cover}\n`;
		if (!out.write(line)) await once(out, 'drain');
	}
	out.end();
	await once(out, 'finish');
}

async function timed(work: () => Promise<unknown>): Promise<number> {
	const start = performance.now();
	await work();
	return (performance.now() - start) / 1000;
}

async function drain(id: number, bytes: number): Promise<void> {
	for await (const _chunk of await openStaged(id, bytes));
}

const median = (xs: number[]) => [...xs].sort((p, q) => p - q)[Math.floor(xs.length / 2)];

loadProjectEnv();
// A staging folder of the bench's own: the read-back must find no local copy.
process.env.IMPORT_STAGING_DIR = await mkdtemp(join(tmpdir(), 'fractile-bench-staging-'));
const source = join(process.env.IMPORT_STAGING_DIR, 'source.csv');
await generate(source);
const rows: { stage: number; put: number; get: number }[] = [];
for (let run = 0; run < RUNS; run++) {
	const id = FIRST_ID + run;
	let staged = { path: '', bytes: 0 };
	const stage = await timed(async () => (staged = await stageUpload(createReadStream(source))));
	const put = await timed(() => storeStaged(id, staged.path, staged.bytes));
	await removeStaged(staged.path);
	const get = await timed(() => drain(id, staged.bytes));
	await removeStagedCopies(id);
	rows.push({ stage, put, get });
	console.log(
		`run ${run + 1}: ${(staged.bytes / 1024 / 1024).toFixed(1)} MB staged locally ${stage.toFixed(3)} s, PUT ${put.toFixed(3)} s, read back ${get.toFixed(3)} s`
	);
}
const load = loadavg().map((l) => l.toFixed(1));
console.log(
	`medians of ${RUNS} (${cpus().length} cores, load average ${load.join(' ')}): staged locally ${median(rows.map((r) => r.stage)).toFixed(3)} s, PUT ${median(rows.map((r) => r.put)).toFixed(3)} s, read back ${median(rows.map((r) => r.get)).toFixed(3)} s`
);
closeStorage();
await rm(process.env.IMPORT_STAGING_DIR, { recursive: true, force: true });
