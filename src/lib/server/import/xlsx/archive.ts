import type { Readable } from 'node:stream';
import { setImmediate } from 'node:timers/promises';
import yauzl from 'yauzl';
import { ImportError } from '../errors';
import { IMPORT_LIMITS } from '../limits';

/*
 * The zip layer of the XLSX reader. yauzl reads the central directory and opens any entry
 * on its own (so the shared strings can be read before the sheet whatever the order of the
 * entries), and it fails an entry that inflates to more than its directory declares. The
 * limits themselves are counted here on the bytes actually inflated, never on what the file
 * declares: a directory can lie about every size.
 */

const megabytes = (bytes: number) => `${Math.round(bytes / 1024 / 1024)} MB`;

const damaged = () =>
	new ImportError(
		'malformed-xlsx',
		'The spreadsheet is damaged: its zip directory cannot be read. Save it again from the spreadsheet program and retry.'
	);

/** Counts the bytes inflated from one file, across its entries, and stops at its limits. */
export class InflateBudget {
	private used = 0;
	readonly limitBytes: number;

	constructor(readonly fileBytes: number) {
		this.limitBytes = Math.min(
			IMPORT_LIMITS.maxUnpackedXlsxBytes,
			Math.max(fileBytes, 64 * 1024) * IMPORT_LIMITS.maxCompressionRatio
		);
	}

	take(bytes: number): void {
		this.used += bytes;
		if (this.used > this.limitBytes) {
			throw new ImportError(
				'zip-bomb',
				`The spreadsheet unpacks to more than ${megabytes(this.limitBytes)} (the limit for a file of ${megabytes(this.fileBytes)} is ${IMPORT_LIMITS.maxCompressionRatio} times its size, at most ${megabytes(IMPORT_LIMITS.maxUnpackedXlsxBytes)}), so it is refused. Nothing was imported.`
			);
		}
	}
}

export interface XlsxArchive {
	entries: Map<string, yauzl.Entry>;
	zip: yauzl.ZipFile;
	budget: InflateBudget;
}

export async function openArchive(path: string, fileBytes: number): Promise<XlsxArchive> {
	const zip = await new Promise<yauzl.ZipFile>((resolve, reject) =>
		yauzl.open(path, { lazyEntries: true, autoClose: false }, (err, file) =>
			err ? reject(damaged()) : resolve(file)
		)
	);
	const entries = new Map<string, yauzl.Entry>();
	try {
		await new Promise<void>((resolve, reject) => {
			zip.on('entry', (entry: yauzl.Entry) => {
				entries.set(entry.fileName, entry);
				// The directory of a hostile file may list many entries: a turn for others now and then.
				if (entries.size > 10_000) reject(damaged());
				else zip.readEntry();
			});
			zip.once('end', resolve);
			zip.once('error', () => reject(damaged()));
			zip.readEntry();
		});
	} catch (err) {
		zip.close();
		throw err;
	}
	return { entries, zip, budget: new InflateBudget(fileBytes) };
}

/** The inflated bytes of one entry as a stream of chunks, counted against the budget. */
export async function* entryChunks(
	archive: XlsxArchive,
	entry: yauzl.Entry,
	maxEntryBytes = Infinity
): AsyncGenerator<Buffer> {
	const stream = await new Promise<Readable>((resolve, reject) =>
		archive.zip.openReadStream(entry, (err, s) => (err ? reject(damaged()) : resolve(s)))
	);
	let entryBytes = 0;
	try {
		for await (const chunk of stream as AsyncIterable<Buffer>) {
			archive.budget.take(chunk.length);
			entryBytes += chunk.length;
			if (entryBytes > maxEntryBytes) {
				throw new ImportError(
					'zip-bomb',
					`The spreadsheet's ${entry.fileName} unpacks to more than ${megabytes(maxEntryBytes)}, the limit for that part, so it is refused. Nothing was imported.`
				);
			}
			yield chunk;
		}
	} catch (err) {
		if (err instanceof ImportError) throw err;
		if (/too many bytes/.test((err as Error).message)) {
			throw new ImportError(
				'zip-bomb',
				`The spreadsheet's part ${entry.fileName} unpacks to more than the ${entry.uncompressedSize} bytes its zip directory declares: the file is damaged or built to exhaust the server, so it is refused. Nothing was imported.`
			);
		}
		// yauzl's own checks (more bytes than declared, a bad CRC, a broken deflate stream).
		throw new ImportError(
			'malformed-xlsx',
			`The spreadsheet is damaged: its part ${entry.fileName} cannot be unpacked (${(err as Error).message}). Save it again from the spreadsheet program and retry.`
		);
	} finally {
		stream.destroy();
	}
	await setImmediate();
}

export function closeArchive(archive: XlsxArchive): void {
	archive.zip.close();
}
