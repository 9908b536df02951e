import unzipper from 'unzipper';
import { ImportError } from './errors';
import { IMPORT_LIMITS } from './limits';

/**
 * Reads an XLSX file's zip directory before anything is unpacked and refuses a file that would
 * unpack to more than the limit or at an absurd ratio (a zip bomb), or whose directory is
 * missing or damaged. The rows read are capped as well (IMPORT_LIMITS.maxRows) in case a
 * directory understates the sizes.
 */
export async function checkXlsxArchive(path: string, fileBytes: number): Promise<void> {
	let directory: Awaited<ReturnType<typeof unzipper.Open.file>>;
	try {
		directory = await unzipper.Open.file(path);
	} catch {
		throw new ImportError(
			'malformed-xlsx',
			'The spreadsheet is damaged: its zip directory cannot be read. Save it again from the spreadsheet program and retry.'
		);
	}
	const unpacked = directory.files.reduce((sum, f) => sum + f.uncompressedSize, 0);
	const ratio = unpacked / Math.max(fileBytes, 1);
	if (unpacked > IMPORT_LIMITS.maxUnpackedXlsxBytes || ratio > IMPORT_LIMITS.maxCompressionRatio) {
		const mb = Math.round(unpacked / 1024 / 1024);
		throw new ImportError(
			'zip-bomb',
			`The spreadsheet would unpack to ${mb} MB (${Math.round(ratio)} times its size); the limit is ${IMPORT_LIMITS.maxUnpackedXlsxBytes / 1024 / 1024} MB, so it is refused.`
		);
	}
	if (!directory.files.some((f) => /^xl\/worksheets\/.+\.xml$/.test(f.path))) {
		throw new ImportError('malformed-xlsx', 'The spreadsheet has no worksheet to read.');
	}
}
