/**
 * Benchmark of the streamed research export: 1,000,000 readings through the built app over HTTP,
 * with the app's resident memory sampled from /proc while it streams.
 * Run: npm run bench:export   (scripts/bench-export.sh starts the test services and builds)
 * Prints rows, bytes, time, rows/s and the app's peak RSS (VmHWM) for CSV and JSON Lines.
 */
import { readFileSync } from 'node:fs';
import { createMigrator } from '../../src/lib/server/db/migrator';
import { initModels } from '../../src/lib/server/db/models';
import { loadTestEnv } from '../helpers/env';
import { scratchDatabase } from '../helpers/database';
import { startBuiltApp } from '../helpers/server';
import { loadBenchData } from './exportData';

const READINGS = Number(process.env.BENCH_READINGS ?? 1_000_000);
const RSS_LIMIT_MB = 300;

function memoryMb(pid: number, field: 'VmRSS' | 'VmHWM'): number {
	const status = readFileSync(`/proc/${pid}/status`, 'utf8');
	const kb = Number(new RegExp(`${field}:\\s+(\\d+)`).exec(status)?.[1] ?? 0);
	return kb / 1024;
}

async function timeExport(origin: string, token: string, file: string, pid: number) {
	const started = performance.now();
	const response = await fetch(`${origin}/api/v1/research/exports/${file}`, {
		headers: { authorization: `Bearer ${token}` }
	});
	if (!response.ok) throw new Error(`${file}: ${response.status} ${await response.text()}`);
	let bytes = 0;
	let lines = 0;
	let peakRssMb = 0;
	for await (const chunk of response.body as unknown as AsyncIterable<Uint8Array>) {
		bytes += chunk.length;
		for (let i = 0; i < chunk.length; i++) if (chunk[i] === 10) lines++;
		peakRssMb = Math.max(peakRssMb, memoryMb(pid, 'VmRSS'));
	}
	const seconds = (performance.now() - started) / 1000;
	const rows = file.endsWith('.csv') ? lines - 1 : lines;
	return { file, rows, megabytes: bytes / 1e6, seconds, rowsPerSecond: rows / seconds, peakRssMb };
}

async function timeStatistics(origin: string, token: string, pid: number) {
	const started = performance.now();
	const response = await fetch(`${origin}/api/v1/research/statistics?groupBy=memberType`, {
		headers: { authorization: `Bearer ${token}` }
	});
	const body = (await response.json()) as { selection: { readingCount: number } };
	if (body.selection.readingCount !== READINGS) throw new Error('statistics missed readings');
	return { seconds: (performance.now() - started) / 1000, peakMb: memoryMb(pid, 'VmHWM') };
}

loadTestEnv();
const scratch = await scratchDatabase('bench_export');
try {
	await createMigrator(scratch.sequelize).up();
	initModels(scratch.sequelize);
	const loading = performance.now();
	const token = await loadBenchData(scratch.sequelize, READINGS);
	console.log(
		`loaded ${READINGS} readings in ${((performance.now() - loading) / 1000).toFixed(1)} s`
	);
	const app = await startBuiltApp({ DB_NAME: `${process.env.DB_NAME}_bench_export` });
	try {
		console.log(`app idle RSS ${memoryMb(app.pid, 'VmRSS').toFixed(0)} MB`);
		const results = [];
		for (const file of ['readings.csv', 'readings.jsonl']) {
			results.push(
				await timeExport(app.origin, token, file, app.pid).catch((e) => {
					console.error(app.output().slice(-3000));
					throw e;
				})
			);
		}
		// The exports' peak, read before the statistics run (which hold the covers in memory).
		const highWaterMb = memoryMb(app.pid, 'VmHWM');
		const statistics = await timeStatistics(app.origin, token, app.pid);
		console.table(
			results.map((r) => ({
				file: r.file,
				rows: r.rows,
				MB: r.megabytes.toFixed(0),
				seconds: r.seconds.toFixed(1),
				'rows/s': Math.round(r.rowsPerSecond),
				'peak RSS MB (sampled)': r.peakRssMb.toFixed(0)
			}))
		);
		console.log(`app peak RSS during the exports (VmHWM): ${highWaterMb.toFixed(0)} MB`);
		console.log(
			`statistics of ${READINGS} readings (2 groups; cover, deviation, margin): ${statistics.seconds.toFixed(1)} s, app peak RSS then ${statistics.peakMb.toFixed(0)} MB`
		);
		const ok = results.every((r) => r.rows === READINGS) && highWaterMb < RSS_LIMIT_MB;
		console.log(ok ? `PASS: every row, RSS under ${RSS_LIMIT_MB} MB` : 'FAIL');
		if (!ok) process.exitCode = 1;
	} finally {
		await app.stop();
	}
} finally {
	await scratch.drop();
}
