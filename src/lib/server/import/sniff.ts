import { fileTypeFromBuffer } from 'file-type';
import { ImportError } from './errors';

export type SourceFormat = 'csv' | 'xlsx';

const XLSX_MIME = 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet';

/** Share of control bytes (other than tab, CR, LF) above which a file is not text. */
const MAX_CONTROL_SHARE = 0.01;

function controlShare(sample: Uint8Array): number {
	let control = 0;
	for (const byte of sample) {
		if (byte === 0) return 1;
		if (byte < 32 && byte !== 9 && byte !== 10 && byte !== 13) control++;
	}
	return sample.length === 0 ? 0 : control / sample.length;
}

/**
 * UTF-16 or UTF-32 text by its byte-order mark (The Unicode Standard, §23.8). Checked before
 * the magic numbers: "FF FE" or "FF FB" opens an MP3 frame too, and a text file was called one.
 */
function unicodeByteOrder(sample: Uint8Array): string | null {
	const [a, b, c, d] = sample;
	if (a === 0xff && b === 0xfe) return c === 0 && d === 0 ? 'UTF-32' : 'UTF-16';
	if (a === 0xfe && b === 0xff) return 'UTF-16';
	if (a === 0 && b === 0 && c === 0xfe && d === 0xff) return 'UTF-32';
	return null;
}

/**
 * The file's format from its bytes, never from its name: a spreadsheet named .csv is read as a
 * spreadsheet, and an image or archive named .csv is refused with what it really is.
 */
export async function sniffFormat(sample: Uint8Array, fileName: string): Promise<SourceFormat> {
	if (sample.length === 0) {
		throw new ImportError('empty-file', 'The file is empty (0 bytes): it holds no readings.');
	}
	const utf = unicodeByteOrder(sample);
	if (utf) {
		throw new ImportError(
			'unsupported-encoding',
			`This file is text in ${utf} (it starts with that encoding's byte-order mark), which the import does not read. Save it again as "CSV UTF-8" (or plain CSV) and upload that file.`
		);
	}
	const type = await fileTypeFromBuffer(sample);
	const namedXlsx = /\.xlsx$/i.test(fileName);
	if (type?.mime === XLSX_MIME) return 'xlsx';
	if (type?.ext === 'zip' && namedXlsx) return 'xlsx'; // parts file-type did not reach; zipGuard decides
	if (type) {
		throw new ImportError(
			'not-tabular',
			`This file is ${type.mime} (.${type.ext}), not a CSV or XLSX file of readings.`
		);
	}
	if (namedXlsx) {
		throw new ImportError(
			'malformed-xlsx',
			'This file is named .xlsx but is not a spreadsheet: it holds no XLSX (zip) content.'
		);
	}
	if (controlShare(sample) > MAX_CONTROL_SHARE) {
		throw new ImportError(
			'binary-file',
			'This file is not text: it holds binary bytes, so it cannot be a CSV export. Is it the right file?'
		);
	}
	return 'csv';
}
