/**
 * Writes an import's valid readings inside its transaction, one chunk in flight while the next
 * is validated. Two ways, the same rows:
 * - LOAD DATA LOCAL INFILE of a chunk file we write (the default): the server's own bulk path,
 *   measured ≈ 1.4× the connector's batch() on a million readings (docs/performance.md);
 * - the mariadb connector's batch() (bulk protocol), where the server refuses local files.
 * LOAD DATA LOCAL turns row errors into warnings (the server cannot stop the client mid-file),
 * so every chunk must come back with exactly its rows written and no warning, or the import
 * fails and rolls back.
 */
import { randomUUID } from 'node:crypto';
import { mkdir, rm, writeFile } from 'node:fs/promises';
import { join } from 'node:path';
import type { Connection } from 'mariadb';
import type { Transaction } from 'sequelize';
import { stagingDir } from './stage';
import type { ValidReading } from './validateRow';

export type WriteMethod = 'load-data' | 'bulk';

/**
 * The connector connection a Sequelize transaction runs on, so bulk writes run inside that
 * transaction.
 */
export function connectionOf(transaction: Transaction): Connection {
	const connection = (transaction as unknown as { connection?: Connection }).connection;
	if (!connection) throw new Error('the transaction has no connection yet');
	return connection;
}

/** LOAD DATA when the server allows local files (MariaDB's default), else batch(). */
export async function chooseWriteMethod(connection: Connection): Promise<WriteMethod> {
	const [row] = (await connection.query('SELECT @@GLOBAL.local_infile AS allowed')) as {
		allowed: number | bigint;
	}[];
	return Number(row?.allowed) === 1 ? 'load-data' : 'bulk';
}

export class WriteMismatchError extends Error {}

interface ChunkResult {
	affectedRows: number;
	warningStatus: number;
}

/** Readings into one import's transaction: one chunk written while the next is filled. */
export class ReadingWriter {
	rowsWritten = 0;
	private text = new ChunkText();
	private params: unknown[][] = [];
	private inFlight: Promise<void> = Promise.resolve();
	private readonly files = new Set<string>();
	private idFloor: number | null = null;
	private aborted = false;
	private readonly line: (r: ValidReading) => string;
	private readonly loadSql: string;

	constructor(
		private readonly connection: Connection,
		private readonly method: WriteMethod,
		private readonly batchId: number,
		private readonly flags: number,
		private readonly chunkRows: number,
		/** The optional columns the file fills (the mapped ones); the others are left NULL. */
		optionalColumns: readonly OptionalColumn[] = OPTIONAL_COLUMNS
	) {
		this.line = tsvLineOf(optionalColumns);
		this.loadSql = loadChunkSql(optionalColumns);
	}

	/** Queues a reading; answers a promise only when a chunk is sent (await it: back-pressure). */
	add(reading: ValidReading): Promise<void> | undefined {
		if (this.method === 'load-data') this.text.append(this.line(reading));
		else this.params.push(bulkParams(reading, this.batchId, this.flags));
		// The first chunk is a fifth of the others, so the database starts writing sooner.
		const size = this.idFloor === null ? Math.ceil(this.chunkRows / 5) : this.chunkRows;
		return this.text.rows + this.params.length >= size ? this.flush() : undefined;
	}

	/** Writes what is left and waits for every chunk; answers the range of ids written. */
	async finish(): Promise<{ firstReadingId: number; lastReadingId: number } | null> {
		await this.flush();
		await this.inFlight;
		if (this.rowsWritten === 0 || this.idFloor === null) return null;
		return { firstReadingId: this.idFloor + 1, lastReadingId: (await this.nextReadingId()) - 1 };
	}

	/**
	 * Stops a failed or cancelled import's writing: waits for the chunk in flight and removes
	 * chunk files. Call it BEFORE rolling back, so that no chunk reaches the connection after the
	 * transaction has ended (it would be written outside it, and kept).
	 */
	async abort(): Promise<void> {
		this.aborted = true;
		await this.inFlight.catch(() => undefined);
		await Promise.all([...this.files].map((f) => rm(f, { force: true })));
	}

	private async flush(): Promise<void> {
		await this.inFlight;
		const count = this.text.rows + this.params.length;
		if (count === 0) return;
		// The sequence hands ids out in increasing order, so every id this import gets lies
		// between one drawn before its first chunk and one drawn after its last.
		this.idFloor ??= await this.nextReadingId();
		const write = this.method === 'load-data' ? this.loadChunk(this.text.take()) : this.bulkChunk();
		this.params = [];
		this.inFlight = write.then((result) => this.check(result, count));
		this.inFlight.catch(() => undefined); // awaited by the next flush or finish
	}

	private check(result: ChunkResult, count: number): void {
		if (Number(result.affectedRows) !== count || Number(result.warningStatus) !== 0) {
			throw new WriteMismatchError(
				`the database wrote ${result.affectedRows} of ${count} rows with ${result.warningStatus} warning(s)`
			);
		}
		this.rowsWritten += count;
	}

	private async loadChunk(text: Buffer): Promise<ChunkResult> {
		const dir = join(stagingDir(), 'chunks');
		await mkdir(dir, { recursive: true });
		const file = join(dir, `${this.batchId}-${randomUUID()}.tsv`);
		this.files.add(file);
		try {
			await writeFile(file, text);
			if (this.aborted) throw new Error('the import stopped before this chunk was written');
			return (await this.connection.query(this.loadSql, [
				file,
				this.batchId,
				this.flags
			])) as ChunkResult;
		} finally {
			await rm(file, { force: true });
			this.files.delete(file);
		}
	}

	private async bulkChunk(): Promise<ChunkResult> {
		const rows = this.params;
		const result = (await this.connection.batch(INSERT_READINGS, rows)) as ChunkResult;
		return { affectedRows: result.affectedRows, warningStatus: result.warningStatus ?? 0 };
	}

	/** A value drawn from the sequence behind readings.id (migration 009). */
	private async nextReadingId(): Promise<number> {
		const [row] = (await this.connection.query('SELECT NEXT VALUE FOR reading_ids AS id')) as {
			id: number | bigint;
		}[];
		return Number(row.id);
	}
}

/**
 * A chunk file's bytes, built in one growing Buffer outside the JS heap. Kept as an array of
 * line strings, 50,000 lines lived long enough to be promoted and cost ~3 s of garbage
 * collection and ~90 MB of peak memory per million readings (docs/performance.md). Lines are
 * joined into a short string first and copied in a few kB at a time: one Buffer.write a line
 * cost ≈ 0.9 s a million lines in calls into the runtime.
 */
export class ChunkText {
	rows = 0;
	private bytes = Buffer.allocUnsafe(1 << 20);
	private length = 0;
	private pending = '';

	append(line: string): void {
		this.pending += line;
		this.rows++;
		if (this.pending.length >= PENDING_CHARS) this.copyPending();
	}

	/** The bytes so far, leaving an empty chunk behind. */
	take(): Buffer {
		this.copyPending();
		const taken = this.bytes.subarray(0, this.length);
		this.bytes = Buffer.allocUnsafe(this.bytes.length);
		this.length = 0;
		this.rows = 0;
		return taken;
	}

	private copyPending(): void {
		const text = this.pending;
		this.pending = '';
		// A UTF-16 code unit is at most 3 bytes of UTF-8.
		if (this.length + text.length * 3 > this.bytes.length) {
			const grown = Buffer.allocUnsafe(
				Math.max(this.bytes.length * 2, this.length + text.length * 3)
			);
			this.bytes.copy(grown, 0, 0, this.length);
			this.bytes = grown;
		}
		this.length += this.bytes.write(text, this.length, 'utf8');
	}
}

/** Characters of lines joined before they are copied into the chunk's bytes. */
const PENDING_CHARS = 16_384;

/** The readings' columns a file may leave empty, in chunk-file order after member_id and cover. */
export const OPTIONAL_COLUMNS = [
	'xMm',
	'yMm',
	'barDiameterMm',
	'barSpacingMm',
	'barDirection',
	'note'
] as const;
export type OptionalColumn = (typeof OPTIONAL_COLUMNS)[number];

const COLUMN_NAMES: Record<OptionalColumn, string> = {
	xMm: 'x_mm',
	yMm: 'y_mm',
	barDiameterMm: 'bar_diameter_mm',
	barSpacingMm: 'bar_spacing_mm',
	barDirection: 'bar_direction',
	note: 'note'
};

/**
 * LOAD DATA of a chunk file holding member_id, cover_mm and `columns`; the batch and flags are
 * the same for every row (SET clause), and columns not listed keep their default, NULL. Leaving
 * out the unmapped columns spares the server reading a \N for each (≈ 8 bytes a row).
 */
function loadChunkSql(columns: readonly OptionalColumn[]): string {
	const names = ['member_id', 'cover_mm', ...columns.map((c) => COLUMN_NAMES[c])];
	return (
		"LOAD DATA LOCAL INFILE ? INTO TABLE readings CHARACTER SET utf8mb4 FIELDS TERMINATED BY '\\t' ESCAPED BY '\\\\' LINES TERMINATED BY '\\n' " +
		`(${names.join(', ')}) SET import_batch_id = ?, flags = ?`
	);
}

const INSERT_READINGS =
	'INSERT INTO readings (member_id, import_batch_id, x_mm, y_mm, cover_mm, bar_diameter_mm, ' +
	'bar_spacing_mm, bar_direction, flags, note) VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?)';

/** LOAD DATA's NULL marker (with the default ESCAPED BY '\\'). */
const NULL_FIELD = '\\N';

/** Text escaped for LOAD DATA's default escape character: backslash, tab, newline, CR, NUL. */
function tsvText(value: string | null): string {
	if (value === null) return NULL_FIELD;
	return value.replace(/[\\\t\n\r\0]/g, (c) =>
		c === '\\' ? '\\\\' : c === '\t' ? '\\t' : c === '\n' ? '\\n' : c === '\r' ? '\\r' : '\\0'
	);
}

/**
 * A length as the shortest decimal text of the double (ECMAScript Number::toString), which the
 * server parses back to the same double.
 */
const tsvNumber = (mm: number | null) => (mm === null ? NULL_FIELD : String(mm));

const TEXT_COLUMNS: ReadonlySet<OptionalColumn> = new Set(['barDirection', 'note']);

/** A chunk-file line maker for files that fill `columns`: member id, cover, then each column. */
export function tsvLineOf(columns: readonly OptionalColumn[]): (r: ValidReading) => string {
	const fields = columns.map((column) =>
		TEXT_COLUMNS.has(column)
			? (r: ValidReading) => tsvText(r[column] as string | null)
			: (r: ValidReading) => tsvNumber(r[column] as number | null)
	);
	// The common cover-meter file (member, x, y, cover) gets a line without the loop.
	if (columns.length === 2 && columns[0] === 'xMm' && columns[1] === 'yMm') {
		return (r) =>
			`${r.memberId}\t${tsvNumber(r.coverMm)}\t${tsvNumber(r.xMm)}\t${tsvNumber(r.yMm)}\n`;
	}
	return (r) => {
		let line = `${r.memberId}\t${tsvNumber(r.coverMm)}`;
		for (let i = 0; i < fields.length; i++) line += '\t' + fields[i](r);
		return line + '\n';
	};
}

/** A chunk-file line with every column. */
export const tsvLine = tsvLineOf(OPTIONAL_COLUMNS);

/**
 * Lengths go as decimal text: the bulk protocol sends one parameter type per packet and starts a
 * new packet whenever a number switches between integer and fractional (30 vs 30.5), which cut
 * the insert rate about fivefold on real covers.
 */
const asText = (mm: number | null) => (mm === null ? null : String(mm));

function bulkParams(r: ValidReading, batchId: number, flags: number): unknown[] {
	return [
		r.memberId,
		batchId,
		asText(r.xMm),
		asText(r.yMm),
		asText(r.coverMm),
		asText(r.barDiameterMm),
		asText(r.barSpacingMm),
		r.barDirection,
		flags,
		r.note
	];
}
