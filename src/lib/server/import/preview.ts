import { createReadStream } from 'node:fs';
import { detectDecimalMark, detectHeaderRow, detectText, type TextDetection } from './detect';
import { ImportError } from './errors';
import { IMPORT_LIMITS } from './limits';
import {
	headerSignature,
	suggestMapping,
	suggestUnits,
	type LengthField,
	type LengthUnit,
	type ReadingField
} from './mapping';
import { sniffFormat, type SourceFormat } from './sniff';
import type { ImportKind } from '../db/models/ImportBatch';
import { suggestMeasurementMapping } from './measurements/mapping';
import { csvRecordBatches, xlsxRecordBatches } from './sources';
import type { RecordBatch } from './records';
import { readSample } from './stage';

export interface FilePreview {
	format: SourceFormat;
	settings: TextDetection;
	headers: string[];
	/** The first data rows as text, for the user to check the mapping against. */
	rows: string[][];
	/** Reading fields, or a measurement file's fields (measurements/mapping.ts), to columns. */
	suggestedMapping: Partial<Record<ReadingField, number>> | Record<string, number>;
	/** The unit each suggested length column's header names ("Position (m)" → m). */
	suggestedUnits: Partial<Record<LengthField, LengthUnit>>;
	headerSignature: string;
	warnings: string[];
}

async function firstRecords(source: AsyncGenerator<RecordBatch>, count: number) {
	const records: string[][] = [];
	for await (const batch of source) {
		for (const record of batch) if (record.some((c) => c.trim() !== '')) records.push(record);
		if (records.length >= count) break;
	}
	await source.return(undefined);
	return records.slice(0, count);
}

async function xlsxSettings(path: string, warnings: string[]) {
	let records: string[][];
	try {
		records = await firstRecords(xlsxRecordBatches(path, warnings), 40);
	} catch (err) {
		if (err instanceof ImportError) throw err;
		throw new ImportError('malformed-xlsx', 'The spreadsheet is damaged and cannot be read.');
	}
	const headerRowIndex = detectHeaderRow(records);
	const settings: TextDetection = {
		encoding: 'utf-8',
		delimiter: ',',
		headerRowIndex,
		...detectDecimalMark(records, ',')
	};
	return { settings, records };
}

async function csvSettings(path: string, sample: Uint8Array, bytes: number) {
	const settings = detectText(sample, bytes <= sample.length);
	const records = await firstRecords(
		csvRecordBatches(createReadStream(path, { highWaterMark: 16 * 1024 }), settings),
		40
	);
	return { settings, records };
}

/** Detects a staged file's format and settings and shows its first rows; refuses what it can. */
export async function previewStagedFile(
	path: string,
	fileName: string,
	bytes: number,
	kind: ImportKind = 'readings'
): Promise<FilePreview> {
	const sample = await readSample(path);
	const format = await sniffFormat(sample, fileName);
	const warnings: string[] = [];
	const { settings, records } =
		format === 'xlsx' ? await xlsxSettings(path, warnings) : await csvSettings(path, sample, bytes);
	const headerAt = settings.headerRowIndex;
	const width = Math.max(0, ...records.map((r) => r.length));
	const headers =
		headerAt >= 0 ? records[headerAt] : Array.from({ length: width }, (_, i) => `Column ${i + 1}`);
	const rows = records.slice(headerAt + 1, headerAt + 1 + IMPORT_LIMITS.previewRows);
	if (records.length === 0)
		throw new ImportError('empty-file', 'The file is empty: it holds no rows of readings.');
	if (rows.length === 0)
		throw new ImportError('header-only', 'The file has a header row but no readings under it.');
	if (settings.mixedDecimalMarks) {
		warnings.push(
			'The first rows use both "." and "," as decimal marks; rows written with the other mark will be refused.'
		);
	}
	if (width <= 1) {
		warnings.push('Every row is a single column: check the delimiter.');
	}
	const suggestedMapping =
		kind === 'readings' ? suggestMapping(headers) : suggestMeasurementMapping(kind, headers);
	return {
		format,
		settings,
		headers,
		rows,
		suggestedMapping,
		suggestedUnits: kind === 'readings' ? suggestUnits(headers, suggestedMapping) : {},
		headerSignature: headerSignature(headers),
		warnings
	};
}
