import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Sequelize } from 'sequelize';
import { ImportBatch } from '../../../src/lib/server/db/models';
import type { Actor } from '../../../src/lib/server/policy';
import {
	actorFor,
	countReadings,
	csv,
	freshSurvey,
	importFile,
	otherOrganisation,
	testSequelize
} from '../../helpers/intake';
import { Readable } from 'node:stream';
import { receiveUpload } from '../../../src/lib/server/import/batches';

const HEADER = 'Member,X (mm),Y (mm),Cover (mm)';

describe('import of bad input: a clear message, and the whole batch or none of it', () => {
	let sequelize: Sequelize;
	let actor: Actor;
	beforeAll(async () => {
		sequelize = testSequelize();
		actor = await actorFor('surveyor@kestrel-lane.example');
	});
	afterAll(async () => {
		await sequelize.close();
	});

	async function survey() {
		return (await freshSurvey(actor)).survey;
	}

	async function expectUploadRefused(content: string | Buffer, name: string, message: RegExp) {
		const s = await survey();
		await expect(
			receiveUpload(actor, s.id, name, Readable.from([Buffer.from(content)]))
		).rejects.toThrow(message);
		expect(await ImportBatch.count({ where: { surveyId: s.id } })).toBe(0);
		expect(await countReadings(sequelize, { surveyId: s.id })).toBe(0);
	}

	it('imports a good file whole', async () => {
		const s = await survey();
		const { outcome, batch } = await importFile(
			actor,
			s.id,
			'good.csv',
			csv([HEADER, 'M-01,0,0,31.5', 'M-01,150,0,33', 'M-02,0,0,28.2', 'm-03,0,0,40'])
		);
		expect(outcome.message).toBe('4 readings imported.');
		expect(batch.state).toBe('completed');
		expect(await countReadings(sequelize, { surveyId: s.id })).toBe(4);
	});

	it('refuses an empty file', async () => {
		await expectUploadRefused('', 'empty.csv', /The file is empty/);
	});

	it('refuses a file with a header only', async () => {
		await expectUploadRefused(csv([HEADER]), 'header.csv', /header row but no readings/);
	});

	it('fails a file read with the wrong delimiter, writing nothing', async () => {
		const s = await survey();
		const { outcome, batch } = await importFile(
			actor,
			s.id,
			'semicolons.csv',
			csv(['Member;X;Y;Cover', 'M-01;0;0;31', 'M-02;0;0;33']),
			undefined,
			{ delimiter: ',' }
		);
		expect(outcome.state).toBe('failed');
		expect(batch.errorMessage).toMatch(/comma delimiter: the file seems to use another delimiter/);
		expect(await countReadings(sequelize, { surveyId: s.id })).toBe(0);
	});

	it('rejects the whole file for text in a numeric column, or returns just that row', async () => {
		const lines = [HEADER, 'M-01,0,0,31', 'M-01,0,150,abc', 'M-02,0,0,29'];
		const s = await survey();
		const whole = await importFile(actor, s.id, 'text.csv', csv(lines));
		expect(whole.outcome.state).toBe('failed');
		expect(whole.batch.errorMessage).toContain('Row 3: cover "abc" is not a number');
		expect(await countReadings(sequelize, { surveyId: s.id })).toBe(0);

		const s2 = await survey();
		const valid = await importFile(actor, s2.id, 'text.csv', csv(lines), undefined, {
			failingRows: 'import-valid'
		});
		expect(valid.outcome.state).toBe('completed');
		expect(await countReadings(sequelize, { surveyId: s2.id })).toBe(2);
		expect(valid.batch.rejectedRowsCsv).toContain(
			'3,"cover ""abc"" is not a number",M-01,0,150,abc'
		);
	});

	it('refuses negative and absurd covers unless the limit is widened', async () => {
		const s = await survey();
		const bad = await importFile(
			actor,
			s.id,
			'c.csv',
			csv([HEADER, 'M-01,0,0,-3', 'M-01,1,0,450'])
		);
		expect(bad.batch.errorMessage).toContain('cover -3 mm is negative');
		expect(bad.batch.rejectedRowsCsv).toContain('cover 450 mm is above the 300 mm limit');
		expect(await countReadings(sequelize, { surveyId: s.id })).toBe(0);
		const wide = await importFile(actor, s.id, 'c2.csv', csv([HEADER, 'M-01,1,0,450']), undefined, {
			coverMaxMm: 1000
		});
		expect(wide.outcome.state).toBe('completed');
		expect(await countReadings(sequelize, { surveyId: s.id })).toBe(1);
	});

	it('stops inch values entered as mm, and converts them when inch is chosen', async () => {
		const rows = Array.from(
			{ length: 20 },
			(_, i) => `M-01,${i * 100},0,${(1.2 + i * 0.02).toFixed(2)}`
		);
		const s = await survey();
		const asMm = await importFile(actor, s.id, 'inch.csv', csv([HEADER, ...rows]));
		expect(asMm.batch.errorMessage).toMatch(
			/Nearly all covers \(100%\) are below 4 mm: were they measured in inches\?/
		);
		expect(await countReadings(sequelize, { surveyId: s.id })).toBe(0);
		const asInch = await importFile(actor, s.id, 'inch.csv', csv([HEADER, ...rows]), undefined, {
			units: 'inch'
		});
		expect(asInch.outcome.state).toBe('completed');
		const [first] = await sequelize.query<{ cover_mm: number; x_mm: number }>(
			'SELECT cover_mm, x_mm FROM readings WHERE import_batch_id = ? ORDER BY id LIMIT 1',
			{ replacements: [asInch.batch.id], type: 'SELECT' as never }
		);
		expect(first.cover_mm).toBeCloseTo(1.2 * 25.4, 9);
		expect(await countReadings(sequelize, { surveyId: s.id })).toBe(20);
	});

	it('refuses numbers written with the other decimal mark', async () => {
		const s = await survey();
		const content = csv(['Member;X;Y;Cover', 'M-01;0;0;31,5', 'M-01;0;150;32.5', 'M-02;0;0;29,0']);
		const result = await importFile(actor, s.id, 'mixed.csv', content);
		expect(result.upload.preview.settings.decimalMark).toBe(',');
		expect(result.upload.preview.warnings.join(' ')).toMatch(/both "\." and "," as decimal marks/);
		expect(result.batch.errorMessage).toContain(
			`Row 3: cover "32.5" uses the wrong decimal mark (this import reads ',')`
		);
		expect(await countReadings(sequelize, { surveyId: s.id })).toBe(0);
	});

	it('refuses a very long line, at upload when it is near the start, else during the import', async () => {
		const long = `M-01,0,0,${'9'.repeat(100_000)}`;
		await expectUploadRefused(
			csv([HEADER, long]),
			'long.csv',
			/^Line 2 is longer than 16384 bytes/
		);
		const s = await survey();
		// Past the first 64 KB read for the preview, so the import itself meets it.
		const rows = Array.from({ length: 6000 }, (_, i) => `M-01,${i},0,30`);
		const result = await importFile(
			actor,
			s.id,
			'long.csv',
			csv([HEADER, ...rows, long, 'M-02,0,0,30'])
		);
		expect(result.batch.errorMessage).toMatch(/^Line 6002 is longer than 16384 bytes/);
		expect(await countReadings(sequelize, { surveyId: s.id })).toBe(0);
	});

	it('refuses binary files renamed .csv', async () => {
		const png = Buffer.from(
			'89504e470d0a1a0a0000000d49484452000000010000000108060000001f15c489',
			'hex'
		);
		await expectUploadRefused(png, 'readings.csv', /This file is image\/png \(\.png\), not a CSV/);
		const noise = Buffer.from(Array.from({ length: 4096 }, (_, i) => (i * 7919) % 256));
		await expectUploadRefused(noise, 'readings.csv', /This file is not text/);
	});

	it('refuses another organisation’s member labels and surveys', async () => {
		const other = await otherOrganisation();
		const s = await survey();
		const result = await importFile(
			actor,
			s.id,
			'o.csv',
			csv([HEADER, 'M-01,0,0,30', 'OTHER-01,0,0,30'])
		);
		expect(result.batch.errorMessage).toContain(
			'Row 3: member label "OTHER-01" is not a member of this survey'
		);
		expect(await countReadings(sequelize, { surveyId: s.id })).toBe(0);
		await expect(
			receiveUpload(actor, other.survey.id, 'x.csv', Readable.from([Buffer.from('a')]))
		).rejects.toThrow('The survey was not found.');
		expect(await ImportBatch.count({ where: { surveyId: other.survey.id } })).toBe(0);
	});

	it('returns exact duplicate rows with the row they repeat', async () => {
		const s = await survey();
		const result = await importFile(
			actor,
			s.id,
			'dup.csv',
			csv([HEADER, 'M-01,0,0,30', 'M-01,150,0,30', 'M-01,0,0,30']),
			undefined,
			{ failingRows: 'import-valid' }
		);
		expect(result.batch.rejectedRowsCsv).toContain('4,exact duplicate of row 2');
		expect(await countReadings(sequelize, { surveyId: s.id })).toBe(2);
	});
});
