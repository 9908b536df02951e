import { Transform, type Readable } from 'node:stream';
import Papa from 'papaparse';
import iconv from 'iconv-lite';
import ExcelJS from 'exceljs';
import type { TextSettings } from './detect';
import { ImportError } from './errors';
import { IMPORT_LIMITS } from './limits';

/** Refuses a line longer than `maxLineBytes` before the parser has to hold it. */
export function lineLengthGuard(maxLineBytes: number = IMPORT_LIMITS.maxLineBytes): Transform {
	let sinceNewline = 0;
	let line = 1;
	return new Transform({
		transform(chunk: Buffer, _encoding, done) {
			let start = 0;
			for (;;) {
				const newline = chunk.indexOf(10, start);
				const end = newline < 0 ? chunk.length : newline;
				sinceNewline += end - start;
				if (sinceNewline > maxLineBytes) {
					return done(
						new ImportError(
							'line-too-long',
							`Line ${line} is longer than ${maxLineBytes} bytes; a cover-meter export has short lines. Is this the right file, with the right delimiter?`
						)
					);
				}
				if (newline < 0) break;
				sinceNewline = 0;
				line++;
				start = newline + 1;
			}
			done(null, chunk);
		}
	});
}

/** Decoded, parsed records of a delimited text file, streamed: never the whole file at once. */
export async function* csvRecords(
	input: Readable,
	settings: TextSettings
): AsyncGenerator<string[]> {
	const decoder = iconv.decodeStream(settings.encoding === 'windows-1252' ? 'win1252' : 'utf8', {
		stripBOM: true
	});
	const parser = Papa.parse(Papa.NODE_STREAM_INPUT, { delimiter: settings.delimiter });
	const guard = lineLengthGuard();
	const fail = (err: Error) => parser.destroy(err);
	input.on('error', fail);
	guard.on('error', fail);
	decoder.on('error', fail);
	input.pipe(guard).pipe(decoder).pipe(parser);
	try {
		for await (const record of parser as AsyncIterable<string[]>) yield record;
	} finally {
		input.destroy();
	}
}

function cellText(value: ExcelJS.CellValue): string {
	if (value == null) return '';
	if (typeof value === 'number') return String(value);
	if (typeof value === 'string') return value;
	if (typeof value === 'boolean') return value ? 'true' : 'false';
	if (value instanceof Date) return value.toISOString();
	if ('richText' in value) return value.richText.map((r) => r.text).join('');
	if ('result' in value) return cellText(value.result as ExcelJS.CellValue);
	if ('text' in value) return String(value.text);
	if ('error' in value) return String(value.error);
	return '';
}

/** Rows of the first worksheet of an XLSX file, streamed with exceljs' streaming reader. */
export async function* xlsxRecords(input: Readable): AsyncGenerator<string[]> {
	const reader = new ExcelJS.stream.xlsx.WorkbookReader(input, {
		worksheets: 'emit',
		sharedStrings: 'cache',
		hyperlinks: 'ignore',
		styles: 'ignore',
		entries: 'emit'
	});
	try {
		for await (const worksheet of reader) {
			let expected = 1;
			for await (const row of worksheet as AsyncIterable<ExcelJS.Row>) {
				// Empty rows are absent from the stream; keep row numbers true to the sheet.
				for (; expected < row.number; expected++) yield [];
				const values = (row.values as ExcelJS.CellValue[]).slice(1);
				yield Array.from(values, cellText);
				expected = row.number + 1;
			}
			return; // the first worksheet only
		}
	} finally {
		input.destroy();
	}
}
