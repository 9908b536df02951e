import { mkdtemp, readdir } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { startBuiltApp } from './server';
import { signInAs, type HttpClient } from './session';
import { until } from './until';

type App = Awaited<ReturnType<typeof startBuiltApp>>;

/**
 * A built app with a staging folder of its own, as one of several app machines behind a load
 * balancer: what it stages, no other app can read.
 */
export interface Machine {
	app: App;
	stagingDir: string;
	surveyor: HttpClient;
}

/** A new app process on a new machine, or on `stagingDir`'s machine (a restart). */
export async function startMachine(
	overrides: Record<string, string> = {},
	stagingDir?: string
): Promise<Machine> {
	stagingDir ??= await mkdtemp(join(tmpdir(), 'fractile-machine-'));
	const app = await startBuiltApp({ ...overrides, IMPORT_STAGING_DIR: stagingDir });
	return { app, stagingDir, surveyor: await signInAs('surveyor', app.origin) };
}

/** The staged files in a machine's folder (upload copies and half-written uploads). */
export async function stagedFiles(machine: Machine): Promise<string[]> {
	return (await readdir(machine.stagingDir)).filter((n) => n.endsWith('.upload')).sort();
}

/** A CSV of `rows` readings over members M-01..M-03 (every row distinct). */
export function readingsCsv(rows: number): Buffer {
	const lines = ['Member,X (mm),Y (mm),Cover (mm)'];
	for (let i = 0; i < rows; i++) {
		lines.push(`M-0${1 + (i % 3)},${i % 5000},${Math.floor(i / 5000)},${25 + (i % 200) / 10}`);
	}
	return Buffer.from(lines.join('\n') + '\n');
}

/** Step 1 over HTTP: the file as the body. Answers the response and its JSON. */
export async function uploadImport(
	machine: Machine,
	surveyId: number,
	fileName: string,
	body: Buffer,
	contentType = 'text/csv'
) {
	const response = await fetch(
		`${machine.app.origin}/api/v1/surveys/${surveyId}/imports?fileName=${encodeURIComponent(fileName)}`,
		{
			method: 'POST',
			headers: {
				cookie: machine.surveyor.cookie,
				origin: machine.app.origin,
				accept: 'application/json',
				'content-type': contentType
			},
			body: new Uint8Array(body)
		}
	);
	return { status: response.status, body: await response.json() };
}

/** Step 2 over HTTP with the detected settings and `overrides`. */
export function startImport(
	machine: Machine,
	batchId: number,
	settings: Record<string, unknown>,
	overrides: Record<string, unknown> = {}
) {
	const { mixedDecimalMarks: _mixed, ...detected } = settings;
	return machine.surveyor.postJson(`/api/v1/imports/${batchId}/start`, {
		mapping: { memberLabel: 0, x: 1, y: 2, cover: 3 },
		options: { ...detected, ...overrides },
		confirmDuplicate: false
	});
}

export interface ImportView {
	state: string;
	rowsImported: number;
	rowsRejected: number;
	errorMessage: string | null;
	progress: { rowsRead: number } | null;
}

export async function importView(machine: Machine, batchId: number): Promise<ImportView> {
	const response = await machine.surveyor.get(`/api/v1/imports/${batchId}`);
	if (response.status !== 200) throw new Error(`import ${batchId}: ${response.status}`);
	return (await response.json()).import;
}

/** The import's view once it is no longer running. */
export function importEnded(machine: Machine, batchId: number): Promise<ImportView> {
	return until(
		`import ${batchId} to end`,
		async () => {
			const view = await importView(machine, batchId);
			return view.state !== 'running' ? view : null;
		},
		120_000,
		200
	);
}
