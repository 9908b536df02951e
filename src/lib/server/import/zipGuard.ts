import { ImportError } from './errors';
import { IMPORT_LIMITS } from './limits';
import { closeArchive, openArchive, type XlsxArchive } from './xlsx/archive';

/**
 * Opens an XLSX file's zip directory and refuses at once a file whose directory already
 * declares more than the limits (a zip bomb that does not hide), or that has no worksheet.
 * What the directory declares is only a first check: the reader counts the bytes it actually
 * inflates against the same limits (InflateBudget), so an understated size does not pass.
 */
export async function openCheckedArchive(path: string, fileBytes: number): Promise<XlsxArchive> {
	const archive = await openArchive(path, fileBytes);
	try {
		let declared = 0;
		for (const entry of archive.entries.values()) declared += entry.uncompressedSize;
		const ratio = declared / Math.max(fileBytes, 1);
		if (
			declared > IMPORT_LIMITS.maxUnpackedXlsxBytes ||
			ratio > IMPORT_LIMITS.maxCompressionRatio
		) {
			const mb = Math.round(declared / 1024 / 1024);
			throw new ImportError(
				'zip-bomb',
				`The spreadsheet would unpack to ${mb} MB (${Math.round(ratio)} times its size); the limit is ${IMPORT_LIMITS.maxUnpackedXlsxBytes / 1024 / 1024} MB, so it is refused.`
			);
		}
		if (![...archive.entries.keys()].some((p) => /^xl\/worksheets\/.+\.xml$/.test(p))) {
			throw new ImportError('malformed-xlsx', 'The spreadsheet has no worksheet to read.');
		}
		return archive;
	} catch (err) {
		closeArchive(archive);
		throw err;
	}
}
