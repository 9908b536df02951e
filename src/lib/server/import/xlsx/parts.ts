import { posix } from 'node:path';
import { ImportError } from '../errors';
import { IMPORT_LIMITS } from '../limits';
import { entryChunks, type XlsxArchive } from './archive';
import { parseXml, XmlSyntaxError, type XmlHandler } from './xml';

/*
 * The workbook's parts that say which sheet to read and what its shared-string cells hold
 * (ECMA-376 Part 1, §12.3: workbook, relationships, shared string table).
 */

/** Parts other than sheets and shared strings are small; more than this is not a workbook. */
const MAX_SMALL_PART_BYTES = 4 * 1024 * 1024;

export const damagedPart = (part: string, detail: string) =>
	new ImportError(
		'malformed-xlsx',
		`The spreadsheet is damaged: its part ${part} is not valid XML (${detail}). Nothing was imported; save it again from the spreadsheet program and retry.`
	);

async function readPart(
	archive: XlsxArchive,
	name: string,
	handler: XmlHandler,
	maxBytes: number
): Promise<boolean> {
	const entry = archive.entries.get(name);
	if (!entry) return false;
	try {
		for await (const _ of parseXml(entryChunks(archive, entry, maxBytes), handler));
	} catch (err) {
		if (err instanceof XmlSyntaxError) throw damagedPart(name, `line ${err.line}: ${err.message}`);
		throw err;
	}
	return true;
}

export interface SheetRef {
	name: string;
	path: string;
}

/** The workbook's sheets in their order, with the zip path of each sheet's part. */
export async function workbookSheets(archive: XlsxArchive): Promise<SheetRef[]> {
	const declared: { name: string; relId: string }[] = [];
	const found = await readPart(
		archive,
		'xl/workbook.xml',
		{
			open(name, attributes) {
				if (name !== 'sheet') return;
				const relId = Object.entries(attributes).find(([k]) => /(^|:)id$/.test(k))?.[1] ?? '';
				declared.push({ name: attributes.name ?? `Sheet ${declared.length + 1}`, relId });
			},
			close() {},
			text() {}
		},
		MAX_SMALL_PART_BYTES
	);
	const targets = new Map<string, string>();
	await readPart(
		archive,
		'xl/_rels/workbook.xml.rels',
		{
			open(name, attributes) {
				if (name === 'Relationship' && attributes.Id && attributes.Target) {
					const target = attributes.Target;
					targets.set(
						attributes.Id,
						target.startsWith('/') ? target.slice(1) : posix.join('xl', target)
					);
				}
			},
			close() {},
			text() {}
		},
		MAX_SMALL_PART_BYTES
	);
	const sheets = declared
		.map((s) => ({ name: s.name, path: targets.get(s.relId) ?? '' }))
		.filter((s) => archive.entries.has(s.path));
	if (found && sheets.length) return sheets;
	// A workbook part missing or unreadable by reference: the worksheets in name order.
	return [...archive.entries.keys()]
		.filter((p) => /^xl\/worksheets\/[^/]+\.xml$/.test(p))
		.sort((a, b) => a.localeCompare(b, 'en', { numeric: true }))
		.map((path, i) => ({ name: `Sheet ${i + 1}`, path }));
}

/** The shared string table: every string item's text, rich-text runs joined. */
export async function sharedStrings(archive: XlsxArchive): Promise<string[]> {
	const strings: string[] = [];
	let current = '';
	let inText = false;
	let inPhonetic = 0;
	await readPart(
		archive,
		'xl/sharedStrings.xml',
		{
			open(name) {
				if (name === 'si') current = '';
				else if (name === 'rPh') inPhonetic++;
				else if (name === 't' && !inPhonetic) inText = true;
			},
			close(name) {
				if (name === 'si') strings.push(current);
				else if (name === 'rPh') inPhonetic--;
				else if (name === 't') inText = false;
			},
			text(text) {
				if (inText) current += text;
			}
		},
		IMPORT_LIMITS.maxSharedStringsBytes
	);
	return strings;
}
