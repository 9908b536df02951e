import Papa from 'papaparse';
import iconv from 'iconv-lite';
import { looksNumeric, type DecimalMark } from './numbers';

export const ENCODINGS = ['utf-8', 'utf-8-bom', 'windows-1252'] as const;
export type TextEncoding = (typeof ENCODINGS)[number];
export const DELIMITERS = [',', ';', '\t', '|'] as const;
export type Delimiter = (typeof DELIMITERS)[number];

export interface TextSettings {
	encoding: TextEncoding;
	delimiter: Delimiter;
	decimalMark: DecimalMark;
	/** 0-based record index of the header row; -1 when the file has none. */
	headerRowIndex: number;
}

export interface TextDetection extends TextSettings {
	/** Both decimal marks seen among the numbers of the first rows. */
	mixedDecimalMarks: boolean;
}

/** UTF-8 unless the bytes are not valid UTF-8; then Windows-1252 (the usual legacy export). */
export function detectEncoding(sample: Uint8Array, complete = true): TextEncoding {
	if (sample[0] === 0xef && sample[1] === 0xbb && sample[2] === 0xbf) return 'utf-8-bom';
	const decoder = new TextDecoder('utf-8', { fatal: true });
	// A sample cut inside a multi-byte character is not invalid: try without the cut bytes.
	for (let cut = 0; cut <= (complete ? 0 : 3); cut++) {
		try {
			decoder.decode(sample.subarray(0, sample.length - cut));
			return 'utf-8';
		} catch {
			// try a shorter sample, then give up
		}
	}
	return 'windows-1252';
}

export function decodeSample(sample: Uint8Array, encoding: TextEncoding): string {
	const text = iconv.decode(Buffer.from(sample), encoding === 'windows-1252' ? 'win1252' : 'utf8');
	return text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
}

/** Parses the complete lines of a sample (the last, maybe cut, line is dropped). */
export function sampleRecords(text: string, delimiter: Delimiter, complete: boolean): string[][] {
	const lastNewline = text.lastIndexOf('\n');
	const body = complete || lastNewline < 0 ? text : text.slice(0, lastNewline);
	const parsed = Papa.parse<string[]>(body, { delimiter, preview: 200 });
	return parsed.data.filter((r) => !(r.length === 1 && r[0].trim() === ''));
}

function modalWidth(records: string[][]): { width: number; share: number } {
	const counts = new Map<number, number>();
	for (const r of records) counts.set(r.length, (counts.get(r.length) ?? 0) + 1);
	let width = 0;
	let best = 0;
	for (const [w, c] of counts) if (c > best || (c === best && w > width)) [width, best] = [w, c];
	return { width, share: records.length ? best / records.length : 0 };
}

/** The delimiter that splits most rows into the same number (> 1) of fields. */
export function detectDelimiter(text: string, complete: boolean): Delimiter {
	let chosen: Delimiter = ',';
	let bestScore = -1;
	// Order breaks ties: with decimal commas, ';' and tab split consistently where ',' may too.
	for (const delimiter of ['\t', ';', '|', ','] as const) {
		const { width, share } = modalWidth(sampleRecords(text, delimiter, complete));
		const score = width > 1 ? share : -1;
		if (score > bestScore + 1e-9) [chosen, bestScore] = [delimiter, score];
	}
	return chosen;
}

const isTextCell = (c: string) => c.trim() !== '' && !looksNumeric(c);

/** The first full-width row with text cells followed by a row of mostly numbers; else -1. */
export function detectHeaderRow(records: string[][]): number {
	const { width } = modalWidth(records);
	for (let i = 0; i < Math.min(records.length, 30); i++) {
		const row = records[i];
		if (row.length !== width || row.filter(isTextCell).length < Math.ceil(width / 2)) continue;
		const next = records[i + 1];
		if (!next || next.filter((c) => looksNumeric(c)).length >= 1) return i;
	}
	return -1;
}

export function detectDecimalMark(records: string[][], delimiter: Delimiter) {
	let commas = 0;
	let dots = 0;
	for (const row of records)
		for (const cell of row) {
			if (/^\s*[+-]?\d+,\d+\s*$/.test(cell)) commas++;
			else if (/^\s*[+-]?\d*\.\d+\s*$/.test(cell)) dots++;
		}
	const decimalMark: DecimalMark = delimiter !== ',' && commas > 0 && commas >= dots ? ',' : '.';
	return { decimalMark, mixedDecimalMarks: commas > 0 && dots > 0 };
}

/** Detects the settings of a delimited text file from its first bytes. */
export function detectText(sample: Uint8Array, complete: boolean): TextDetection {
	const encoding = detectEncoding(sample, complete);
	const text = decodeSample(sample, encoding);
	const delimiter = detectDelimiter(text, complete);
	const records = sampleRecords(text, delimiter, complete);
	const headerRowIndex = detectHeaderRow(records);
	return { encoding, delimiter, headerRowIndex, ...detectDecimalMark(records, delimiter) };
}
