import { rm } from 'node:fs/promises';
import type { Sequelize } from 'sequelize';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ImportBatch, ImportProgress } from '../../src/lib/server/db/models';
import { actorFor, countReadings, freshSurvey, testSequelize } from '../helpers/intake';
import {
	importEnded,
	readingsCsv,
	stagedFiles,
	startImport,
	startMachine,
	uploadImport,
	type Machine
} from '../helpers/importHttp';
import { ownStorageFake } from '../helpers/storageFake';
import { until } from '../helpers/until';

// What the app says when object storage cannot be reached (src/lib/server/domainErrors.ts).
const STORAGE_DOWN = {
	error: {
		code: 'storage_unavailable',
		message:
			'File storage cannot be reached right now, so the file was not saved and nothing was recorded. Try again in a few minutes.'
	}
};

// The same code, worded for a start: the upload itself is kept (src/lib/server/import/batches.ts).
const NOT_STARTED = {
	error: {
		code: 'storage_unavailable',
		message:
			'File storage cannot be reached right now, so this import has not started; the uploaded file is kept. Try again in a few minutes.'
	}
};

describe('imports when the object-storage fake goes down', () => {
	let sequelize: Sequelize;
	let storage: Awaited<ReturnType<typeof ownStorageFake>>;
	// Two app machines with staging folders of their own, on a storage fake of the test's own.
	let a: Machine;
	let b: Machine;

	beforeAll(async () => {
		sequelize = testSequelize();
		storage = await ownStorageFake();
		await storage.start();
		const env = { S3_ENDPOINT: storage.endpoint };
		[a, b] = await Promise.all([startMachine(env), startMachine(env)]);
	});

	afterAll(async () => {
		await Promise.all([a?.app.stop(), b?.app.stop()]);
		await Promise.all([a, b].map((m) => m && rm(m.stagingDir, { recursive: true, force: true })));
		await storage?.remove();
		await sequelize?.close();
	});

	it('refuses an upload with a plain 503 and records nothing, then takes it once storage is back', async () => {
		const { survey } = await freshSurvey(await actorFor('surveyor@kestrel-lane.example'));
		const csv = readingsCsv(500);
		await storage.stop();
		const refused = await uploadImport(a, survey.id, 'storage-down.csv', csv);
		expect([refused.status, refused.body]).toEqual([503, STORAGE_DOWN]);
		// Nothing half-recorded: no batch, no staged file (and, once storage is back, no object).
		expect(await ImportBatch.count({ where: { surveyId: survey.id } })).toBe(0);
		expect(await stagedFiles(a)).toEqual([]);
		expect(a.app.output()).toMatch(/object storage unavailable \(PUT imports\/batch-\d+\.upload\)/);

		await storage.start();
		expect(await storage.keys('imports/')).toEqual([]);
		const again = await uploadImport(a, survey.id, 'storage-back.csv', csv);
		expect(again.status).toBe(201);
		expect(await storage.keys('imports/')).toEqual([`imports/batch-${again.body.batchId}.upload`]);
		expect(await ImportBatch.count({ where: { surveyId: survey.id } })).toBe(1);
	});

	it('answers a start on a machine without the file with a 503 while storage is down; the batch waits', async () => {
		const { survey } = await freshSurvey(await actorFor('surveyor@kestrel-lane.example'));
		const uploaded = await uploadImport(a, survey.id, 'start-later.csv', readingsCsv(500));
		expect(uploaded.status).toBe(201);
		const { batchId } = uploaded.body;
		const settings = uploaded.body.preview.settings;

		await storage.stop();
		const refused = await startImport(b, batchId, settings);
		expect([refused.status, await refused.json()]).toEqual([503, NOT_STARTED]);
		// Still pending, never marked running: it can simply be started again.
		expect((await ImportBatch.findByPk(batchId))!.state).toBe('pending');
		expect(await ImportProgress.findByPk(batchId)).toBeNull();

		await storage.start();
		expect((await startImport(b, batchId, settings)).status).toBe(202);
		const done = await importEnded(b, batchId);
		expect([done.state, done.rowsImported]).toEqual(['completed', 500]);
		expect(await countReadings(sequelize, { batchId })).toBe(500);
		const key = `imports/batch-${batchId}.upload`;
		await until('the stored copy to go', async () => (await storage.keys(key)).length === 0);
	});
});
