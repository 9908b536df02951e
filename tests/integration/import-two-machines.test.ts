import { rm, utimes, writeFile } from 'node:fs/promises';
import { join } from 'node:path';
import ExcelJS from 'exceljs';
import type { Sequelize } from 'sequelize';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ImportBatch } from '../../src/lib/server/db/models';
import { actorFor, countReadings, freshSurvey, testSequelize } from '../helpers/intake';
import {
	importEnded,
	importView,
	readingsCsv,
	stagedFiles,
	startImport,
	startMachine,
	uploadImport,
	type Machine
} from '../helpers/importHttp';
import { storedKeys } from '../helpers/storageFake';
import { until } from '../helpers/until';

// Large enough that an import is still running when the test cancels it (several seconds here).
const RUNNING_ROWS = 300_000;

const stored = (batchId: number) => storedKeys(`imports/batch-${batchId}.upload`);
const objectGone = (batchId: number) =>
	until(
		`the stored copy of import ${batchId} to go`,
		async () => (await stored(batchId)).length === 0
	);

async function workbook(rows: (string | number)[][]): Promise<Buffer> {
	const book = new ExcelJS.Workbook();
	const sheet = book.addWorksheet('Readings');
	for (const row of rows) sheet.addRow(row);
	return Buffer.from(await book.xlsx.writeBuffer());
}

async function newSurvey() {
	return (await freshSurvey(await actorFor('surveyor@kestrel-lane.example'))).survey;
}

describe('an import uploaded through one app machine and started through another', () => {
	let sequelize: Sequelize;
	// Two app processes with staging folders of their own, like two machines behind a balancer.
	let a: Machine;
	let b: Machine;
	const dirs: string[] = [];
	// Batches A took the upload of and B ended: their copies stay in A's folder, out of B's reach.
	const leftOnA: number[] = [];

	beforeAll(async () => {
		sequelize = testSequelize();
		[a, b] = await Promise.all([startMachine(), startMachine()]);
		dirs.push(a.stagingDir, b.stagingDir);
	});

	afterAll(async () => {
		await Promise.all([a?.app.stop(), b?.app.stop()]);
		await Promise.all(dirs.map((dir) => rm(dir, { recursive: true, force: true })));
		await sequelize?.close();
	});

	it('imports every row from the stored copy, removes it at the end, and undoes through either', async () => {
		const survey = await newSurvey();
		const csv = readingsCsv(2_000);
		const uploaded = await uploadImport(a, survey.id, 'bay-a.csv', csv);
		expect(uploaded.status).toBe(201);
		const { batchId } = uploaded.body;
		// A keeps its copy; B has none; storage holds the copy every machine can read.
		expect(await stagedFiles(a)).toEqual([`batch-${batchId}.upload`]);
		expect(await stagedFiles(b)).toEqual([]);
		expect(await stored(batchId)).toEqual([`imports/batch-${batchId}.upload`]);

		expect((await startImport(b, batchId, uploaded.body.preview.settings)).status).toBe(202);
		const done = await importEnded(b, batchId);
		expect([done.state, done.rowsImported, done.errorMessage]).toEqual(['completed', 2_000, null]);
		expect(await countReadings(sequelize, { batchId })).toBe(2_000);
		await objectGone(batchId);
		// B never wrote it to its own folder; A's copy stays until A's housekeeping (below).
		expect(await stagedFiles(b)).toEqual([]);
		expect(await stagedFiles(a)).toEqual([`batch-${batchId}.upload`]);
		leftOnA.push(batchId);

		const undone = await a.surveyor.postJson(`/api/v1/imports/${batchId}/undo`, {});
		expect(undone.status).toBe(200);
		expect(await undone.json()).toEqual({ rowsDeleted: 2_000 });
		expect(await countReadings(sequelize, { surveyId: survey.id })).toBe(0);
	});

	it('imports an XLSX file the same way, streamed from storage', async () => {
		const survey = await newSurvey();
		const content = await workbook([
			['Member', 'X', 'Y', 'Cover'],
			['M-01', 0, 0, 31.5],
			['M-02', 150, 0, 29],
			['M-03', 300, 0, 42.5]
		]);
		const contentType = 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet';
		const uploaded = await uploadImport(a, survey.id, 'log.xlsx', content, contentType);
		expect([uploaded.status, uploaded.body.preview.format]).toEqual([201, 'xlsx']);
		const { batchId } = uploaded.body;
		expect((await startImport(b, batchId, uploaded.body.preview.settings)).status).toBe(202);
		const done = await importEnded(b, batchId);
		expect([done.state, done.rowsImported]).toEqual(['completed', 3]);
		expect(await countReadings(sequelize, { surveyId: survey.id })).toBe(3);
		await objectGone(batchId);
		leftOnA.push(batchId);
	});

	it('removes the stored copy of a failed import', async () => {
		const survey = await newSurvey();
		const csv = Buffer.from('Member,X,Y,Cover\nM-01,0,0,30\nM-99,0,0,31\n');
		const uploaded = await uploadImport(a, survey.id, 'unknown-member.csv', csv);
		const { batchId } = uploaded.body;
		const start = await startImport(b, batchId, uploaded.body.preview.settings, {
			failingRows: 'reject-file'
		});
		expect(start.status).toBe(202);
		const done = await importEnded(b, batchId);
		expect([done.state, done.rowsImported, done.rowsRejected]).toEqual(['failed', 0, 1]);
		await objectGone(batchId);
		leftOnA.push(batchId);
	});

	it('cancels a pending import through either machine, with its copies', async () => {
		const survey = await newSurvey();
		const first = await uploadImport(a, survey.id, 'first.csv', readingsCsv(10));
		const second = await uploadImport(a, survey.id, 'second.csv', readingsCsv(11));
		const [one, two] = [first.body.batchId as number, second.body.batchId as number];

		// Through B: the stored copy goes (A's own copy is out of B's reach).
		expect((await b.surveyor.postJson(`/api/v1/imports/${one}/cancel`, {})).status).toBe(202);
		expect((await importView(a, one)).state).toBe('cancelled');
		expect(await stored(one)).toEqual([]);
		const late = await startImport(a, one, first.body.preview.settings);
		expect(late.status).toBe(409);
		leftOnA.push(one);

		// Through A, which took the upload: both copies go.
		expect((await a.surveyor.postJson(`/api/v1/imports/${two}/cancel`, {})).status).toBe(202);
		expect(await stored(two)).toEqual([]);
		expect(await stagedFiles(a)).not.toContain(`batch-${two}.upload`);
		expect(await ImportBatch.count({ where: { surveyId: survey.id, state: 'cancelled' } })).toBe(2);
	});

	it('cancels a running import through the machine that did not run it', async () => {
		const survey = await newSurvey();
		const uploaded = await uploadImport(a, survey.id, 'large.csv', readingsCsv(RUNNING_ROWS));
		const { batchId } = uploaded.body;
		expect((await startImport(b, batchId, uploaded.body.preview.settings)).status).toBe(202);
		await until(
			'the import under way',
			async () => ((await importView(a, batchId)).progress?.rowsRead ?? 0) > 0,
			60_000,
			25
		);
		expect((await a.surveyor.postJson(`/api/v1/imports/${batchId}/cancel`, {})).status).toBe(202);
		const done = await importEnded(a, batchId);
		expect([done.state, done.rowsImported]).toEqual(['cancelled', 0]);
		expect(await countReadings(sequelize, { batchId })).toBe(0);
		await objectGone(batchId);
		leftOnA.push(batchId);
	});

	it("clears copies left in a machine's staging folder when it starts, keeping recent ones", async () => {
		const leftovers = await stagedFiles(a);
		expect(leftovers).toEqual(leftOnA.map((id) => `batch-${id}.upload`).sort());
		const hoursAgo = new Date(Date.now() - 2 * 60 * 60 * 1000);
		for (const name of leftovers) await utimes(join(a.stagingDir, name), hoursAgo, hoursAgo);
		const recent = 'batch-999999999.upload';
		await writeFile(join(a.stagingDir, recent), 'an upload that has just arrived');

		await a.app.stop();
		a = await startMachine({}, a.stagingDir);
		await until('the start-up housekeeping', async () => (await stagedFiles(a)).length === 1);
		expect(await stagedFiles(a)).toEqual([recent]);
		expect(a.app.output()).toContain(`${leftovers.length} left-over staged upload(s) removed`);
	});
});
