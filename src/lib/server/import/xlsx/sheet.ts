import { ImportError } from '../errors';
import { IMPORT_LIMITS } from '../limits';
import type { RecordBatch } from '../records';
import { entryChunks, type XlsxArchive } from './archive';
import { damagedPart } from './parts';
import { parseXml, XmlSyntaxError, type XmlHandler } from './xml';

/** Excel's last row and column (Excel specifications and limits: 1,048,576 rows by 16,384
 * columns); a sheet beyond them was not written by a spreadsheet program. */
const LAST_SHEET_ROW = 1_048_576;

function columnIndex(reference: string): number {
	let index = 0;
	for (let i = 0; i < reference.length; i++) {
		const code = reference.charCodeAt(i);
		if (code < 65 || code > 90) break;
		index = index * 26 + (code - 64);
	}
	return index - 1;
}

export function columnName(index: number): string {
	let name = '';
	for (let n = index + 1; n > 0; n = Math.floor((n - 1) / 26))
		name = String.fromCharCode(65 + ((n - 1) % 26)) + name;
	return name;
}

/** A cell's text as the import reads it (ECMA-376 Part 1, §18.3.1.4, the cell's t attribute). */
function cellText(type: string, raw: string, strings: readonly string[], where: string): string {
	switch (type) {
		case 's': {
			const text = strings[Number(raw)];
			if (text === undefined) {
				throw damagedPart(
					'sheet',
					`cell ${where} refers to shared string ${raw}, not in the table`
				);
			}
			return text;
		}
		case 'b':
			return raw === '1' ? 'true' : raw === '0' ? 'false' : raw;
		case 'n': {
			const value = Number(raw);
			return raw.trim() !== '' && Number.isFinite(value) ? String(value) : raw;
		}
		default: // str (a formula's text), inlineStr, e (an error such as #DIV/0!), d (ISO date)
			return raw;
	}
}

/** Reads a sheet's rows as its XML streams, keeping each row's own number. */
class SheetRows implements XmlHandler {
	records: string[][] = [];
	rowNumbers: number[] = [];
	reachedEnd = false;
	private rowNumber = 0;
	private cells: string[] = [];
	private column = 0;
	private cellType = 'n';
	private cellRef = '';
	private value = '';
	private inValue = false;
	private inPhonetic = 0;

	constructor(private readonly strings: readonly string[]) {}

	open(name: string, attributes: Record<string, string>): void {
		if (name === 'row') this.startRow(attributes.r);
		else if (name === 'c') this.startCell(attributes.r, attributes.t);
		else if (name === 'rPh') this.inPhonetic++;
		else if ((name === 'v' || name === 't') && !this.inPhonetic) this.inValue = true;
	}

	close(name: string): void {
		if (name === 'c') {
			this.cells[this.column] = cellText(this.cellType, this.value, this.strings, this.cellRef);
			this.column++;
		} else if (name === 'row') this.endRow();
		else if (name === 'rPh') this.inPhonetic--;
		else if (name === 'v' || name === 't') this.inValue = false;
		else if (name === 'sheetData') this.reachedEnd = true;
	}

	text(text: string): void {
		if (this.inValue) this.value += text;
	}

	/** Takes the rows read so far, each with its number in the sheet. */
	take(): RecordBatch {
		const batch: RecordBatch = Object.assign(this.records, { rowNumbers: this.rowNumbers });
		this.records = [];
		this.rowNumbers = [];
		return batch;
	}

	private startRow(r: string | undefined) {
		const number = r === undefined ? this.rowNumber + 1 : Number(r);
		if (!Number.isInteger(number) || number < 1 || number > LAST_SHEET_ROW) {
			throw new ImportError(
				'malformed-xlsx',
				`The sheet has a row numbered ${String(r).slice(0, 20)} (after row ${this.rowNumber}); a spreadsheet's rows run from 1 to ${LAST_SHEET_ROW}, so the file is damaged or was not written by a spreadsheet program. Nothing was imported.`
			);
		}
		this.rowNumber = number;
		this.cells = [];
		this.column = 0;
	}

	private startCell(r: string | undefined, type: string | undefined) {
		if (r !== undefined) this.column = columnIndex(r);
		this.cellRef = r ?? `${columnName(this.column)}${this.rowNumber}`;
		if (this.column < 0 || this.column >= IMPORT_LIMITS.maxColumns) {
			throw new ImportError(
				'too-many-columns',
				`Row ${this.rowNumber} has a cell at ${this.cellRef.slice(0, 20)}; a sheet of readings may use at most ${IMPORT_LIMITS.maxColumns} columns (A to ${columnName(IMPORT_LIMITS.maxColumns - 1)}). Nothing was imported.`
			);
		}
		this.cellType = type ?? 'n';
		this.value = '';
	}

	private endRow() {
		const cells = Array.from(this.cells, (c) => c ?? '');
		// A row with no text is left out; the next row keeps its own number.
		if (cells.some((c) => c.trim() !== '')) {
			this.records.push(cells);
			this.rowNumbers.push(this.rowNumber);
		}
	}
}

/**
 * The rows of one sheet in batches, as its part inflates. Fails with the sheet's name and the
 * last row read when the XML is broken or ends before the sheet's data does: rows are never
 * lost without a word.
 */
export async function* sheetRecordBatches(
	archive: XlsxArchive,
	sheet: { name: string; path: string },
	strings: readonly string[]
): AsyncGenerator<RecordBatch> {
	const rows = new SheetRows(strings);
	const entry = archive.entries.get(sheet.path)!;
	let lastRow = 0;
	try {
		for await (const _ of parseXml(entryChunks(archive, entry), rows)) {
			if (rows.records.length >= 1000) {
				lastRow = rows.rowNumbers[rows.rowNumbers.length - 1];
				yield rows.take();
			}
		}
	} catch (err) {
		if (!(err instanceof XmlSyntaxError)) throw err;
		const after = rows.rowNumbers.length ? rows.rowNumbers[rows.rowNumbers.length - 1] : lastRow;
		throw new ImportError(
			'malformed-xlsx',
			`The sheet "${sheet.name}" is damaged after row ${after}: its XML breaks at line ${err.line} (${err.message}). No row of the file was imported; save it again from the spreadsheet program and retry.`
		);
	}
	if (!rows.reachedEnd) {
		throw new ImportError(
			'malformed-xlsx',
			`The sheet "${sheet.name}" ends before its data does (no end of the sheet's rows was found), so rows may be missing. Nothing was imported; save it again from the spreadsheet program and retry.`
		);
	}
	if (rows.records.length) yield rows.take();
}
