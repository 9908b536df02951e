/**
 * `npm run bench:site`: on-site entry, measured on the built app over HTTP.
 * 1. The JavaScript the on-site page loads (every /_app/ script chromium fetches for it, the
 *    chunks it imports when it mounts included), gzipped at zlib's default level 6, beside the
 *    member entry page's as a peer. The built server sends files uncompressed (precompress is
 *    off), so gzip is what a compressing proxy in front of it would send.
 * 2. A sync of 5,000 queued readings (one batch, as the device sends it) against the same
 *    readings through the CSV import path (upload, start, poll until done), alternated, RUNS each.
 * Prints figures; asserts nothing (docs/performance.md holds the results).
 */
import { readFile } from 'node:fs/promises';
import { randomUUID } from 'node:crypto';
import { cpus, loadavg } from 'node:os';
import { join } from 'node:path';
import { gzipSync } from 'node:zlib';
import { loadProjectEnv } from '../../scripts/env';
import { createSequelize, readDatabaseSettings } from '../../src/lib/server/db/connection';
import { initModels } from '../../src/lib/server/db/models';
import { launchChromium } from '../helpers/browser';
import { actorFor, freshSurvey } from '../helpers/intake';
import { startBuiltApp } from '../helpers/server';
import { DEMO_PASSWORD, signIn } from '../helpers/session';

const READINGS = Number(process.env.BENCH_READINGS ?? 5000);
const RUNS = Number(process.env.BENCH_RUNS ?? 5);
const MEMBERS = 20;
const SURVEYOR = 'surveyor@kestrel-lane.example';

loadProjectEnv();
const sequelize = createSequelize(readDatabaseSettings(process.env));
initModels(sequelize);
const actor = await actorFor(SURVEYOR);
const labels = Array.from({ length: MEMBERS }, (_, i) => `B-${String(i + 1).padStart(2, '0')}`);

const app = await startBuiltApp({ BODY_SIZE_LIMIT: '64M' });
const client = await signIn(SURVEYOR, DEMO_PASSWORD, app.origin);

// 1. JavaScript of the on-site page, and of the member entry page as the peer.
const { survey: pageSurvey, members: pageMembers } = await freshSurvey(actor, labels.slice(0, 3));
const browser = await launchChromium();
const context = await browser.newContext({ baseURL: app.origin });
await context.addCookies([
	{
		name: client.cookie.split('=')[0],
		value: client.cookie.split('=').slice(1).join('='),
		url: app.origin
	}
]);
async function scriptsOf(path: string) {
	const page = await context.newPage();
	const scripts = new Set<string>();
	page.on('response', (r) => {
		const url = new URL(r.url());
		if (url.pathname.startsWith('/_app/') && url.pathname.endsWith('.js'))
			scripts.add(url.pathname);
	});
	await page.goto(path, { waitUntil: 'networkidle' });
	await page.close();
	let raw = 0;
	let gzipped = 0;
	for (const script of scripts) {
		const bytes = await readFile(join('build/client', script));
		raw += bytes.length;
		gzipped += gzipSync(bytes).length;
	}
	return { files: scripts.size, rawKb: raw / 1024, gzipKb: gzipped / 1024 };
}
const sitePage = await scriptsOf(`/surveys/${pageSurvey.id}/site`);
const entryPage = await scriptsOf(`/members/${pageMembers[0].id}/entry`);
await browser.close();

// 2. 5,000 readings: the sync endpoint against the CSV import path.
function readingRows(memberIds: number[]) {
	return Array.from({ length: READINGS }, (_, i) => ({
		memberId: memberIds[i % memberIds.length],
		clientId: randomUUID(),
		x: String((i * 37) % 6000),
		y: String(Math.floor(i / memberIds.length)),
		cover: (20 + (i % 300) / 10).toFixed(1),
		diameter: '12',
		direction: i % 2 ? 'x' : 'y',
		note: ''
	}));
}
async function timedSync(): Promise<number> {
	const { survey, members } = await freshSurvey(actor, labels);
	const body = { batchId: randomUUID(), readings: readingRows(members.map((m) => m.id)) };
	const started = performance.now();
	const response = await client.postJson(`/api/v1/surveys/${survey.id}/site-sync`, body);
	const answer = await response.json();
	const seconds = (performance.now() - started) / 1000;
	if (response.status !== 201 || answer.readings !== READINGS)
		throw new Error(`sync refused: ${JSON.stringify(answer)}`);
	return seconds;
}
async function timedImport(): Promise<number> {
	const { survey, members } = await freshSurvey(actor, labels);
	const labelOf = new Map(members.map((m) => [m.id, m.label]));
	const lines = ['Member,X (mm),Y (mm),Cover (mm),Bar (mm),Layer,Note'];
	for (const r of readingRows(members.map((m) => m.id)))
		lines.push([labelOf.get(r.memberId), r.x, r.y, r.cover, r.diameter, r.direction, ''].join(','));
	const file = Buffer.from(lines.join('\n') + '\n');
	const started = performance.now();
	const uploaded = await client.postBody(
		`/api/v1/surveys/${survey.id}/imports?fileName=site-peer-${randomUUID()}.csv`,
		new Uint8Array(file),
		'text/csv'
	);
	const upload = await uploaded.json();
	if (uploaded.status !== 201) throw new Error(`upload refused: ${JSON.stringify(upload)}`);
	const { mixedDecimalMarks: _m, ...options } = upload.preview.settings;
	const start = await client.postJson(`/api/v1/imports/${upload.batchId}/start`, {
		mapping: { memberLabel: 0, x: 1, y: 2, cover: 3, diameter: 4, direction: 5, note: 6 },
		options,
		confirmDuplicate: true
	});
	if (start.status !== 202) throw new Error(`start refused: ${await start.text()}`);
	for (;;) {
		const status = (await (await client.get(`/api/v1/imports/${upload.batchId}`)).json()).import;
		if (status.state === 'completed') break;
		if (status.state !== 'running')
			throw new Error(`import ${status.state}: ${status.errorMessage}`);
		await new Promise((r) => setTimeout(r, 20));
	}
	return (performance.now() - started) / 1000;
}
await timedSync(); // warm-up of both paths, not counted
await timedImport();
const sync: number[] = [];
const peer: number[] = [];
for (let i = 0; i < RUNS; i++) {
	sync.push(await timedSync());
	peer.push(await timedImport());
}
await Promise.race([app.stop(), new Promise((r) => setTimeout(r, 3000))]);
try {
	process.kill(app.pid, 'SIGKILL');
} catch {
	// already gone
}
await sequelize.close();

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];
const kb = (x: number) => x.toFixed(1);
console.log(
	`machine: ${cpus().length} cores, load average ${loadavg()
		.map((l) => l.toFixed(2))
		.join(' ')}`
);
console.log(
	`on-site page JS:      ${sitePage.files} files, ${kb(sitePage.rawKb)} kB raw, ${kb(sitePage.gzipKb)} kB gzipped (target < 150 kB)`
);
console.log(
	`member entry page JS: ${entryPage.files} files, ${kb(entryPage.rawKb)} kB raw, ${kb(entryPage.gzipKb)} kB gzipped (peer)`
);
console.log(
	`sync of ${READINGS} readings: median ${median(sync).toFixed(2)} s of ${RUNS} (${sync.map((s) => s.toFixed(2)).join(', ')}) (target < 2 s)`
);
console.log(
	`same readings as CSV import (upload, start, poll): median ${median(peer).toFixed(2)} s (${peer.map((s) => s.toFixed(2)).join(', ')})`
);
process.exit(0);
