import { existsSync } from 'node:fs';
import { QueryTypes, type Sequelize } from 'sequelize';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { AuditEvent, ImportBatch, ImportProgress } from '../../src/lib/server/db/models';
import { failAbandonedImports } from '../../src/lib/server/import/progress';
import { stagedPathOf } from '../../src/lib/server/import/stage';
import { actorFor, countReadings, freshSurvey, testSequelize } from '../helpers/intake';
import { startBuiltApp } from '../helpers/server';
import { signInAs, type HttpClient } from '../helpers/session';
import { storedKeys } from '../helpers/storageFake';
import { until } from '../helpers/until';

type App = Awaited<ReturnType<typeof startBuiltApp>>;

// Large enough that the import is still running when the test acts (several seconds here).
const ROWS = 300_000;
const ABANDONED =
	'The import stopped before it finished (the server handling it ended, or lost its database connection); nothing was written. Start it again.';

function readingsCsv(): Buffer {
	const lines = ['Member,X (mm),Y (mm),Cover (mm)'];
	for (let i = 0; i < ROWS; i++) {
		lines.push(`M-0${1 + (i % 3)},${i % 5000},${Math.floor(i / 5000)},${25 + (i % 200) / 10}`);
	}
	return Buffer.from(lines.join('\n') + '\n');
}

interface ImportView {
	state: string;
	errorMessage: string | null;
	rowsImported: number;
	progress: { rowsRead: number } | null;
}

/** The upload → start flow of the import page, over HTTP (tests/bench/import.bench.ts). */
async function uploadAndStart(app: App, client: HttpClient, surveyId: number, csv: Buffer) {
	const uploaded = await fetch(
		`${app.origin}/api/v1/surveys/${surveyId}/imports?fileName=bay-readings.csv`,
		{
			method: 'POST',
			headers: {
				cookie: client.cookie,
				origin: app.origin,
				accept: 'application/json',
				'content-type': 'text/csv'
			},
			body: new Uint8Array(csv)
		}
	);
	const upload = await uploaded.json();
	expect(uploaded.status).toBe(201);
	const { mixedDecimalMarks: _mixed, ...detected } = upload.preview.settings;
	const start = await client.postJson(`/api/v1/imports/${upload.batchId}/start`, {
		mapping: { memberLabel: 0, x: 1, y: 2, cover: 3 },
		options: detected,
		// Confirmed only if the app asks: a file whose earlier import failed is no duplicate.
		confirmDuplicate: upload.duplicateOf !== null
	});
	expect(start.status).toBe(202);
	return { batchId: upload.batchId as number, duplicateOf: upload.duplicateOf };
}

async function viewOf(client: HttpClient, batchId: number): Promise<ImportView> {
	const response = await client.get(`/api/v1/imports/${batchId}`);
	expect(response.status).toBe(200);
	return (await response.json()).import;
}

/** Running, rows read, rows written inside its one transaction, its connection recorded. */
function underWay(client: HttpClient, batchId: number) {
	return until(
		'the import under way',
		async () => {
			const view = await viewOf(client, batchId);
			const progress = await ImportProgress.findByPk(batchId);
			const ok = view.state === 'running' && (view.progress?.rowsRead ?? 0) > 0;
			return ok && progress && progress.rowsWritten > 0 && progress.connectionId ? progress : null;
		},
		60_000,
		25
	);
}

async function connectionOpen(sequelize: Sequelize, id: number): Promise<boolean> {
	const rows = await sequelize.query('SELECT ID FROM information_schema.PROCESSLIST WHERE ID = ?', {
		replacements: [id],
		type: QueryTypes.SELECT
	});
	return rows.length > 0;
}

describe('when an app process is killed mid-import', () => {
	let sequelize: Sequelize;
	const apps: App[] = [];
	const start = async () => {
		const app = await startBuiltApp({});
		apps.push(app);
		return app;
	};

	beforeAll(() => {
		sequelize = testSequelize();
	});

	afterAll(async () => {
		await Promise.all(apps.map((app) => app.stop()));
		await sequelize?.close();
	});

	it('fails the batch when the app starts again, leaves none of its rows, and a retry completes', async () => {
		const { survey } = await freshSurvey(await actorFor('surveyor@kestrel-lane.example'));
		const csv = readingsCsv();
		const killed = await start();
		const before = await signInAs('surveyor', killed.origin);
		const { batchId } = await uploadAndStart(killed, before, survey.id, csv);
		const progress = await underWay(before, batchId);

		await killed.kill('SIGKILL');
		// MariaDB sees the socket close and rolls the transaction back; the thread leaves the
		// process list only after that (MariaDB's unlink_thd: THD::cleanup, then the erase).
		await until(
			'MariaDB to end the dead connection',
			async () => !(await connectionOpen(sequelize, Number(progress.connectionId))),
			30_000
		);
		// Nobody has looked since: the batch still says running, its upload still staged and stored.
		const storedCopy = `imports/batch-${batchId}.upload`;
		expect((await ImportBatch.findByPk(batchId))!.state).toBe('running');
		expect(existsSync(stagedPathOf(batchId))).toBe(true);
		expect(await storedKeys(storedCopy)).toEqual([storedCopy]);

		const restarted = await start();
		// No request touches the import: the app's start-up alone must settle it, promptly.
		const settled = await until('the batch to be settled', async () => {
			const batch = await ImportBatch.findByPk(batchId);
			return batch && batch.state !== 'running' ? batch : null;
		});
		expect([settled.state, settled.errorMessage]).toEqual(['failed', ABANDONED]);
		await until('the start-up sweep to say so', async () =>
			/\d+ import\(s\) left running by an ended process failed/.test(restarted.output())
		);
		expect(await countReadings(sequelize, { batchId })).toBe(0);
		expect(existsSync(stagedPathOf(batchId))).toBe(false);
		expect(await storedKeys(storedCopy)).toEqual([]);
		const events = await AuditEvent.findAll({
			where: { subjectType: 'import_batch', subjectId: String(batchId) }
		});
		expect(events.map((e) => e.action)).toEqual(['import.failed']);
		expect(events[0].detail).toMatchObject({ message: ABANDONED });

		const surveyor = await signInAs('surveyor', restarted.origin);
		const seen = await viewOf(surveyor, batchId);
		expect([seen.state, seen.errorMessage, seen.progress]).toEqual(['failed', ABANDONED, null]);

		const retry = await uploadAndStart(restarted, surveyor, survey.id, csv);
		expect(retry.duplicateOf).toBeNull();
		const done = await until(
			'the retry to finish',
			async () => {
				const view = await viewOf(surveyor, retry.batchId);
				return view.state !== 'running' ? view : null;
			},
			120_000,
			250
		);
		expect([done.state, done.rowsImported]).toEqual(['completed', ROWS]);
		expect(await countReadings(sequelize, { surveyId: survey.id })).toBe(ROWS);
		expect(await countReadings(sequelize, { batchId })).toBe(0);
	});

	it('never fails an import that another live process is running', async () => {
		const { survey } = await freshSurvey(await actorFor('surveyor@kestrel-lane.example'));
		const [importing, other] = await Promise.all([start(), start()]);
		const client = await signInAs('surveyor', importing.origin);
		const watcher = await signInAs('surveyor', other.origin);
		const { batchId } = await uploadAndStart(importing, client, survey.id, readingsCsv());
		await underWay(client, batchId);

		// Every status read through the other process sweeps for abandoned imports first.
		const states: string[] = [];
		const done = await until(
			'the import to finish',
			async () => {
				await failAbandonedImports();
				const view = await viewOf(watcher, batchId);
				states.push(view.state);
				return view.state !== 'running' ? view : null;
			},
			120_000,
			100
		);
		expect(states.filter((s) => s === 'running').length).toBeGreaterThan(0);
		expect([done.state, done.rowsImported]).toEqual(['completed', ROWS]);
		expect(await countReadings(sequelize, { batchId })).toBe(ROWS);
		const failures = await AuditEvent.count({
			where: { action: 'import.failed', subjectId: String(batchId) }
		});
		expect(failures).toBe(0);
	});
});
