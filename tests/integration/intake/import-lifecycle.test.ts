import { Readable } from 'node:stream';
import { QueryTypes, type Sequelize } from 'sequelize';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { AuditEvent, ImportProgress, Survey } from '../../../src/lib/server/db/models';
import {
	cancelImport,
	importStatus,
	undoImport
} from '../../../src/lib/server/import/batchActions';
import { receiveUpload, startImport } from '../../../src/lib/server/import/batches';
import type { Actor } from '../../../src/lib/server/policy';
import {
	actorFor,
	countReadings,
	csv,
	freshSurvey,
	importFile,
	options,
	standardMapping,
	testSequelize
} from '../../helpers/intake';

const HEADER = 'Member,X,Y,Cover';

function bigCsv(rows: number): string {
	const lines = [HEADER];
	for (let i = 0; i < rows; i++)
		lines.push(`M-0${1 + (i % 3)},${i % 5000},${Math.floor(i / 5000)},${25 + (i % 200) / 10}`);
	return csv(lines);
}

describe('import lifecycle: duplicates, undo, cancel, a lost connection, frozen surveys', () => {
	let sequelize: Sequelize;
	let actor: Actor;
	beforeAll(async () => {
		sequelize = testSequelize();
		actor = await actorFor('surveyor@kestrel-lane.example');
	});
	afterAll(async () => {
		await sequelize.close();
	});

	async function begin(surveyId: number, content: string) {
		const upload = await receiveUpload(
			actor,
			surveyId,
			'big.csv',
			Readable.from([Buffer.from(content)])
		);
		return startImport(actor, upload.batchId, {
			mapping: standardMapping,
			options: options(),
			confirmDuplicate: false,
			saveTemplateAs: null
		});
	}

	async function waitForRows(batchId: number, rows: number) {
		// By the clock, not a count of polls: under a whole suite's load a poll can take longer.
		const deadline = Date.now() + 30_000;
		while (Date.now() < deadline) {
			const p = await ImportProgress.findByPk(batchId);
			if (p && p.rowsRead >= rows && p.connectionId) return p;
			await new Promise((r) => setTimeout(r, 10));
		}
		throw new Error('the import did not get going');
	}

	it('catches a file imported before, and imports it again only when confirmed', async () => {
		const { survey } = await freshSurvey(actor);
		const content = csv([HEADER, 'M-01,0,0,30', 'M-02,0,0,31']);
		await importFile(actor, survey.id, 'a.csv', content);
		const again = await receiveUpload(
			actor,
			survey.id,
			'a-copy.csv',
			Readable.from([Buffer.from(content)])
		);
		expect(again.duplicateOf).toMatchObject({ fileName: 'a.csv', rowsImported: 2 });
		const input = {
			mapping: standardMapping,
			options: options(),
			confirmDuplicate: false,
			saveTemplateAs: null
		};
		await expect(startImport(actor, again.batchId, input)).rejects.toThrow(
			/already imported .*Confirm to import it again/
		);
		expect(await countReadings(sequelize, { surveyId: survey.id })).toBe(2);
		const confirmed = await startImport(actor, again.batchId, { ...input, confirmDuplicate: true });
		expect((await confirmed.done).state).toBe('completed');
		expect(await countReadings(sequelize, { surveyId: survey.id })).toBe(4);
	});

	it('undoes exactly one batch’s readings, with an audit event', async () => {
		const { survey } = await freshSurvey(actor);
		const kept = await importFile(actor, survey.id, 'k.csv', csv([HEADER, 'M-01,0,0,30']));
		const undone = await importFile(
			actor,
			survey.id,
			'u.csv',
			csv([HEADER, 'M-02,0,0,31', 'M-03,0,0,32'])
		);
		expect(await undoImport(actor, undone.batch.id)).toBe(2);
		expect(await countReadings(sequelize, { batchId: kept.batch.id })).toBe(1);
		expect(await countReadings(sequelize, { surveyId: survey.id })).toBe(1);
		expect((await importStatus(actor, undone.batch.id)).state).toBe('undone');
		const event = await AuditEvent.findOne({
			where: { action: 'import.undone', subjectId: String(undone.batch.id) }
		});
		expect(event?.detail).toMatchObject({ rowsDeleted: 2 });
		await expect(undoImport(actor, undone.batch.id)).rejects.toThrow(/this one is undone/);
	});

	it('cancels a running import and leaves nothing behind', async () => {
		const { survey } = await freshSurvey(actor);
		const started = await begin(survey.id, bigCsv(300_000));
		await waitForRows(started.batchId, 20_000);
		await cancelImport(actor, started.batchId);
		const outcome = await started.done;
		expect(outcome).toMatchObject({
			state: 'cancelled',
			message: 'The import was cancelled; nothing was written.'
		});
		expect(await countReadings(sequelize, { surveyId: survey.id })).toBe(0);
	});

	it('fails cleanly when its database connection is killed, and a retry succeeds', async () => {
		const { survey } = await freshSurvey(actor);
		const content = bigCsv(300_000);
		const started = await begin(survey.id, content);
		const progress = await waitForRows(started.batchId, 30_000);
		await sequelize.query(`KILL ${Number(progress.connectionId)}`, { type: QueryTypes.RAW });
		const outcome = await started.done;
		expect(outcome.state).toBe('failed');
		expect(outcome.message).toBe(
			'The connection to the database was lost during the import; nothing was written. Start the import again.'
		);
		expect(await countReadings(sequelize, { surveyId: survey.id })).toBe(0);
		const retry = await begin(survey.id, content);
		expect((await retry.done).state).toBe('completed');
		expect(await countReadings(sequelize, { surveyId: survey.id })).toBe(300_000);
	});

	it('refuses imports and undo once the survey is submitted', async () => {
		const { survey } = await freshSurvey(actor);
		const done = await importFile(actor, survey.id, 's.csv', csv([HEADER, 'M-01,0,0,30']));
		await Survey.update({ status: 'submitted' }, { where: { id: survey.id } });
		await expect(
			receiveUpload(
				actor,
				survey.id,
				'late.csv',
				Readable.from([Buffer.from(csv([HEADER, 'M-01,1,0,30']))])
			)
		).rejects.toThrow(
			'The survey is submitted: its readings are frozen. An engineer can return it for changes.'
		);
		await expect(undoImport(actor, done.batch.id)).rejects.toThrow(/frozen/);
		expect(await countReadings(sequelize, { surveyId: survey.id })).toBe(1);
	});
});
