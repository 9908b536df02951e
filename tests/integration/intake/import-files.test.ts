import { Readable } from 'node:stream';
import ExcelJS from 'exceljs';
import iconv from 'iconv-lite';
import type { Sequelize } from 'sequelize';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ImportBatch, Reading } from '../../../src/lib/server/db/models';
import { receiveUpload } from '../../../src/lib/server/import/batches';
import { columnMappingSchema } from '../../../src/lib/server/import/mapping';
import type { Actor } from '../../../src/lib/server/policy';
import {
	actorFor,
	countReadings,
	freshSurvey,
	importFile,
	testSequelize
} from '../../helpers/intake';
import { buildZip } from '../../helpers/zip';

async function workbook(rows: (string | number)[][]): Promise<Buffer> {
	const book = new ExcelJS.Workbook();
	const sheet = book.addWorksheet('Readings');
	for (const row of rows) sheet.addRow(row);
	return Buffer.from(await book.xlsx.writeBuffer());
}

describe('import of XLSX files and text encodings', () => {
	let sequelize: Sequelize;
	let actor: Actor;
	beforeAll(async () => {
		sequelize = testSequelize();
		actor = await actorFor('surveyor@kestrel-lane.example');
	});
	afterAll(async () => {
		await sequelize.close();
	});

	async function expectUploadRefused(content: Buffer, name: string, message: RegExp) {
		const { survey } = await freshSurvey(actor);
		await expect(receiveUpload(actor, survey.id, name, Readable.from([content]))).rejects.toThrow(
			message
		);
		expect(await ImportBatch.count({ where: { surveyId: survey.id } })).toBe(0);
	}

	it('imports the first worksheet of an XLSX file, header found below a title row', async () => {
		const { survey } = await freshSurvey(actor);
		const content = await workbook([
			['Site log, bay survey'],
			['Member', 'X', 'Y', 'Cover'],
			['M-01', 0, 0, 31.5],
			['M-02', 150, 0, 29]
		]);
		const { upload, outcome } = await importFile(actor, survey.id, 'log.xlsx', content);
		expect(upload.preview.format).toBe('xlsx');
		expect(upload.preview.settings.headerRowIndex).toBe(1);
		expect(upload.preview.headers).toEqual(['Member', 'X', 'Y', 'Cover']);
		expect(outcome.state).toBe('completed');
		expect(await countReadings(sequelize, { surveyId: survey.id })).toBe(2);
	});

	it('refuses a malformed XLSX: not a zip, and a truncated one', async () => {
		await expectUploadRefused(
			Buffer.from('Member,X\nM-01,1\n'),
			'log.xlsx',
			/is named \.xlsx but is not a spreadsheet/
		);
		const good = await workbook([
			['Member', 'Cover'],
			['M-01', 30]
		]);
		await expectUploadRefused(
			good.subarray(0, good.length - 200),
			'log.xlsx',
			/The spreadsheet is damaged/
		);
	});

	it('refuses a zip bomb before unpacking it', async () => {
		const bomb = buildZip([
			{ name: '[Content_Types].xml', data: Buffer.from('<Types/>') },
			{ name: 'xl/worksheets/sheet1.xml', data: Buffer.alloc(40 * 1024 * 1024, 0x20) }
		]);
		await expectUploadRefused(bomb, 'bomb.xlsx', /would unpack to 40 MB \(\d+ times its size\)/);
	});

	it('writes each mapped column to its own field, in any column order, and leaves the rest empty', async () => {
		const { survey } = await freshSurvey(actor);
		// Every field, the file's columns in an order unlike the table's; a quoted note with the
		// delimiter and a backslash (RFC 4180 quoting; LOAD DATA's escape character is '\\').
		const mapping = columnMappingSchema.parse({
			note: 0,
			cover: 1,
			spacing: 2,
			memberLabel: 3,
			direction: 4,
			diameter: 5,
			y: 6,
			x: 7
		});
		const all = await importFile(
			actor,
			survey.id,
			'all-fields.csv',
			'Note,Cover,Spacing,Member,Layer,Bar,Y,X\n' +
				'"by the joint, C:\\deck",31.5,150,M-01,top,16,200,100\n' +
				',29,,M-02,,,,\n',
			mapping
		);
		expect(all.outcome.state).toBe('completed');
		// A file of covers only, every row for one member.
		const coversOnly = await importFile(
			actor,
			survey.id,
			'covers.csv',
			'Cover\n27.25\n',
			columnMappingSchema.parse({ cover: 0 }),
			{ fixedMemberLabel: 'M-01' }
		);
		expect(coversOnly.outcome.state).toBe('completed');
		const rows = await Reading.findAll({
			where: { importBatchId: [all.batch.id, coversOnly.batch.id] },
			order: [['id', 'ASC']]
		});
		const fields = (r: Reading) => [
			r.coverMm,
			r.xMm,
			r.yMm,
			r.barDiameterMm,
			r.barSpacingMm,
			r.barDirection,
			r.note
		];
		expect(rows.map(fields)).toEqual([
			[31.5, 100, 200, 16, 150, 'top', 'by the joint, C:\\deck'],
			[29, null, null, null, null, null, null],
			[27.25, null, null, null, null, null, null]
		]);
	});

	it('reads Windows-1252 and UTF-8 with BOM', async () => {
		const { survey } = await freshSurvey(actor);
		const mapping = columnMappingSchema.parse({ memberLabel: 0, cover: 1, note: 2 });
		const legacy = iconv.encode('Member;Cover;Note\nM-01;31,5;près du joint\n', 'win1252');
		const first = await importFile(actor, survey.id, 'legacy.csv', legacy, mapping);
		expect(first.upload.preview.settings).toMatchObject({
			encoding: 'windows-1252',
			delimiter: ';',
			decimalMark: ','
		});
		const bom = Buffer.concat([
			Buffer.from([0xef, 0xbb, 0xbf]),
			Buffer.from('Member,Cover,Note\nM-02,28,über\n')
		]);
		const second = await importFile(actor, survey.id, 'bom.csv', bom, mapping);
		expect(second.upload.preview.headers[0]).toBe('Member');
		const notes = await Reading.findAll({
			where: { importBatchId: [first.batch.id, second.batch.id] },
			order: [['id', 'ASC']]
		});
		expect(notes.map((r) => [r.note, r.coverMm])).toEqual([
			['près du joint', 31.5],
			['über', 28]
		]);
	});
});
