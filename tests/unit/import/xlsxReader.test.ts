import { Readable } from 'node:stream';
import ExcelJS from 'exceljs';
import { describe, expect, it } from 'vitest';
import { buildXlsx, sheetXml } from '../../helpers/xlsx';
import { xlsxRecordBatches } from '$lib/server/import/sources';

/** Every record of the first sheet with its row number (numbered in order when none is given). */
async function readAll(content: Buffer, warnings: string[] = []) {
	const rows: { row: number; cells: string[] }[] = [];
	let counted = 0;
	const started = performance.now();
	for await (const batch of xlsxRecordBatches(Readable.from([content]), warnings)) {
		const numbers = (batch as { rowNumbers?: readonly number[] }).rowNumbers;
		batch.forEach((cells, i) => {
			counted++;
			rows.push({ row: numbers ? numbers[i] : counted, cells });
		});
	}
	return { rows, ms: performance.now() - started };
}

async function exceljsWorkbook(sheets: Record<string, (string | number)[][]>) {
	const book = new ExcelJS.Workbook();
	for (const [name, rows] of Object.entries(sheets)) {
		const sheet = book.addWorksheet(name);
		for (const row of rows) sheet.addRow(row);
	}
	return Buffer.from(await book.xlsx.writeBuffer());
}

describe('XLSX reader', () => {
	it('reads the first sheet of a workbook a spreadsheet library wrote, shared strings and numbers', async () => {
		const content = await exceljsWorkbook({
			Readings: [
				['Member', 'Cover'],
				['M-01', 31.5],
				['M-02', 29]
			]
		});
		const { rows } = await readAll(content);
		expect(rows.map((r) => r.cells)).toEqual([
			['Member', 'Cover'],
			['M-01', '31.5'],
			['M-02', '29']
		]);
	});

	it('sparse row numbers (rows 1, 2 and 1,048,576) give three records, not a million empty ones', async () => {
		const content = buildXlsx([
			{
				name: 'Readings',
				xml: sheetXml([
					{ r: 1, cells: ['Member', 'Cover'] },
					{ r: 2, cells: ['M-01', 30] },
					{ r: 1_048_576, cells: ['M-02', 31] }
				])
			}
		]);
		const { rows } = await readAll(content);
		expect(rows).toEqual([
			{ row: 1, cells: ['Member', 'Cover'] },
			{ row: 2, cells: ['M-01', '30'] },
			{ row: 1_048_576, cells: ['M-02', '31'] }
		]);
	});

	it('refuses a row numbered past the last row a spreadsheet can have (3,000,000)', async () => {
		const content = buildXlsx([
			{
				name: 'Readings',
				xml: sheetXml([
					{ r: 1, cells: ['Member', 'Cover'] },
					{ r: 2, cells: ['M-01', 30] },
					{ r: 3_000_000, cells: ['M-02', 31] }
				])
			}
		]);
		await expect(readAll(content)).rejects.toThrow(
			/row numbered 3000000 \(after row 2\); a spreadsheet's rows run from 1 to 1048576/
		);
	});

	it('refuses a shared-string part that holds far more than its declared 1,000 bytes (hidden zip bomb)', async () => {
		const item = '<si><t>' + 'x'.repeat(1000) + '</t></si>';
		const xml = Buffer.from(
			'<?xml version="1.0"?><sst xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main">' +
				item.repeat(20_000) +
				'</sst>'
		);
		const content = buildXlsx(
			[{ name: 'Readings', xml: sheetXml([{ cells: ['Member', 'Cover'] }]) }],
			{ xml, declaredSize: 1000 }
		);
		expect(content.length).toBeLessThan(200_000); // 20 MB of strings in a small file
		await expect(readAll(content)).rejects.toThrow(
			/xl\/sharedStrings\.xml unpacks to more than the 1000 bytes its zip directory declares/
		);
	});

	it('an unescaped & in row 4 fails the file naming the sheet and the last good row; no row is returned as if complete', async () => {
		const good = sheetXml([
			{ cells: ['Member', 'Cover'] },
			{ cells: ['M-01', 30] },
			{ cells: ['M-02', 31] },
			{ cells: ['M-03', 32] },
			{ cells: ['M-04', 33] }
		]);
		const broken = good.replace('<t>M-03</t>', '<t>M-03 & joint</t>');
		const content = buildXlsx([{ name: 'Readings', xml: broken }]);
		await expect(readAll(content)).rejects.toThrow(/The sheet "Readings" is damaged after row 3/);
	});

	it('a sheet whose XML stops before the end of its rows fails rather than ending quietly', async () => {
		const whole = sheetXml([{ cells: ['Member', 'Cover'] }, { cells: ['M-01', 30] }]);
		const cut = whole.slice(0, whole.indexOf('</sheetData>'));
		await expect(readAll(buildXlsx([{ name: 'Readings', xml: cut }]))).rejects.toThrow(
			/The sheet "Readings" is damaged after row 2/
		);
	});

	it('warns that the other sheets of a workbook were not read, naming them', async () => {
		const content = await exceljsWorkbook({
			Readings: [
				['Member', 'Cover'],
				['M-01', 30]
			],
			'Second bay': [
				['Member', 'Cover'],
				['M-02', 31]
			]
		});
		const warnings: string[] = [];
		const { rows } = await readAll(content, warnings);
		expect(rows).toHaveLength(2);
		expect(warnings).toEqual([
			expect.stringMatching(
				/2 sheets; only the first, "Readings", was read. Not read: "Second bay"/
			)
		]);
	});

	it('a spreadsheet error cell (#DIV/0!) reads as its error text, not as an empty cell', async () => {
		const xml = sheetXml([{ cells: ['Member', 'Cover'] }]).replace(
			'</sheetData>',
			'<row r="2"><c r="A2" t="inlineStr"><is><t>M-01</t></is></c><c r="B2" t="e"><f>1/0</f><v>#DIV/0!</v></c></row></sheetData>'
		);
		const { rows } = await readAll(buildXlsx([{ name: 'Readings', xml }]));
		expect(rows[1].cells).toEqual(['M-01', '#DIV/0!']);
	});
});
