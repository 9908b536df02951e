import { PassThrough } from 'node:stream';
import { setImmediate } from 'node:timers/promises';
import type { Transaction } from 'sequelize';
import { ImportBatch, Member } from '../db/models';
import { recordAudit } from '../audit';
import { DuplicateFinder } from './dedupe';
import { ImportError } from './errors';
import { IMPORT_LIMITS } from './limits';
import type { ColumnMapping } from './mapping';
import { tickProgress } from './progress';
import { RejectedRows } from './rejected';
import type { RecordBatch } from './records';
import { csvRecordBatches, xlsxRecordBatches } from './sources';
import type { SourceFormat } from './sniff';
import { createRowValidator, labelKey } from './validateRow';
import { CoverCollector } from '../readings/coverCollector';
import {
	chooseWriteMethod,
	connectionOf,
	OPTIONAL_COLUMNS,
	ReadingWriter,
	type OptionalColumn
} from './writer';
import { finishImport, type ImportOutcome } from './finish';
import type { ImportJob, ImportTally } from './job';

export async function memberIndex(surveyId: number): Promise<Map<string, number>> {
	const members = await Member.findAll({ where: { surveyId }, attributes: ['id', 'label'] });
	return new Map(members.map((m) => [labelKey(m.label), m.id]));
}

/** A grid's rows as one batch, numbered from 1; their cells' bytes count as read. */
async function* gridBatches(
	cells: NonNullable<ImportJob['cells']>,
	tally: ImportTally
): AsyncGenerator<RecordBatch> {
	const batch: RecordBatch = Object.assign([...cells.rows], {
		rowNumbers: cells.rows.map((_, i) => i + 1)
	});
	tally.bytesRead += gridBytes(cells.rows);
	yield batch;
}

/** The size of a grid's cells as one line each, for the progress bar's total. */
export function gridBytes(rows: readonly string[][]): number {
	return rows.reduce((sum, cells) => sum + Buffer.byteLength(cells.join(',')) + 1, 0);
}

function recordBatches(job: ImportJob, tally: ImportTally): AsyncGenerator<RecordBatch> {
	if (job.cells) return gridBatches(job.cells, tally);
	if (!job.open) throw new ImportError('empty-file', 'The import has neither a file nor rows.');
	const counter = new PassThrough();
	counter.on('data', (chunk: Buffer) => (tally.bytesRead += chunk.length));
	const input = job.open();
	input.on('error', (err) => counter.destroy(err));
	// The parsers destroy what they read when they stop, early too (a cancel, a refused file):
	// the source's file handle or storage connection goes with it rather than waiting for a timeout.
	counter.once('close', () => input.destroy());
	input.pipe(counter);
	return job.format === 'xlsx'
		? xlsxRecordBatches(counter, tally.sourceWarnings)
		: csvRecordBatches(counter, job.options);
}

/** What a cancelled import says, whenever the cancel was seen. */
const CANCELLED = 'The import was cancelled; nothing was written.';

/** The reading columns the file fills: the rest stay NULL and are left out of the chunk files. */
function mappedColumns(mapping: ColumnMapping): OptionalColumn[] {
	const fieldOf: Record<OptionalColumn, keyof ColumnMapping> = {
		xMm: 'x',
		yMm: 'y',
		barDiameterMm: 'diameter',
		barSpacingMm: 'spacing',
		barDirection: 'direction',
		note: 'note'
	};
	return OPTIONAL_COLUMNS.filter((column) => mapping[fieldOf[column]] != null);
}

function isBlank(cells: string[]): boolean {
	for (let i = 0; i < cells.length; i++)
		if (cells[i] !== '' && cells[i].trim() !== '') return false;
	return true;
}

/**
 * A CSV row with more filled fields than its header: a delimiter inside a value that was not
 * quoted shifts the value's end into a field of its own, which no column maps, so the end of a
 * note was lost without a word. Empty trailing fields (some exports end every row with the
 * delimiter) are no loss. A spreadsheet's cells cannot shift, so XLSX rows are not checked.
 */
export function extraFields(
	format: SourceFormat,
	headers: readonly string[],
	cells: readonly string[]
) {
	if (format !== 'csv' || headers.length === 0 || cells.length <= headers.length) return null;
	if (cells.slice(headers.length).every((c) => c.trim() === '')) return null;
	return {
		ok: false as const,
		code: 'width.extra',
		reason: `the row has ${cells.length} fields but the header has ${headers.length}: is there a delimiter inside a value that is not quoted? Put the value in double quotes`
	};
}

/**
 * Streams the file through validation into the readings table inside `transaction`, with one
 * chunk being written while the next is parsed. Throws ImportError('cancelled') on a cancel.
 */
async function streamRows(
	job: ImportJob,
	writer: ReadingWriter,
	tally: ImportTally,
	connectionId?: number
) {
	const validate = createRowValidator(job.mapping, job.options, await memberIndex(job.surveyId));
	const duplicates = new DuplicateFinder();
	const rejectAll = job.options.failingRows === 'reject-file';
	let lastTick = Date.now();
	let index = -1; // among non-blank records, as detection counts them
	let recordNumber = 0; // every record, so row numbers match the file's lines
	let processed = 0;
	for await (const batch of recordBatches(job, tally))
		for (let i = 0; i < batch.length; i++) {
			const cells = batch[i];
			const rowNumber = batch.rowNumbers ? batch.rowNumbers[i] : ++recordNumber;
			// Every record counts, blank ones too: the limit and the event loop's turns hold for a
			// file of millions of empty lines as for one of readings. A turn every 64 records (a few
			// hundred µs of work): the connector streams each chunk file to the server from this
			// same loop, one 64 kB read a turn, and other requests wait on it too. Yielding every
			// 512 rows left LOAD DATA 1.6× slower than alone (docs/performance.md).
			if (rowNumber > IMPORT_LIMITS.maxRows) {
				throw new ImportError(
					'too-many-rows',
					`The file has more than ${IMPORT_LIMITS.maxRows} rows; split it.`
				);
			}
			if ((++processed & 63) === 0) await setImmediate();
			if (isBlank(cells)) continue;
			if (++index <= job.options.headerRowIndex) {
				if (index === job.options.headerRowIndex) tally.headers = cells;
				continue;
			}
			tally.rowsRead++;
			const result = extraFields(job.format, tally.headers, cells) ?? validate(cells);
			if (!result.ok) {
				tally.rejected.add(rowNumber, result.code, result.reason, cells);
			} else {
				const earlier = duplicates.check(result.reading, rowNumber);
				if (earlier !== undefined) {
					tally.rejected.add(rowNumber, 'duplicate', `exact duplicate of row ${earlier}`, cells);
				} else {
					if (result.reading.coverMm < 4) tally.smallCovers++;
					if (!(rejectAll && tally.rejected.count > 0)) {
						tally.covers.add(result.reading.memberId, result.reading.coverMm);
						const sending = writer.add(result.reading);
						if (sending) {
							await sending;
							tally.rowsWritten = writer.rowsWritten;
						}
					}
				}
			}
			tally.rowsRejected = tally.rejected.count;
			if (
				(tally.rowsRead & 1023) === 0 &&
				Date.now() - lastTick > IMPORT_LIMITS.progressIntervalMs
			) {
				lastTick = Date.now();
				if (await tickProgress(job.batchId, tally, connectionId)) {
					throw new ImportError('cancelled', CANCELLED);
				}
			}
		}
}

/**
 * Runs one import to its end: every row validated, the valid ones written in ONE transaction
 * that commits together with the batch's final state and its audit event, or nothing written.
 */
export async function runImport(job: ImportJob): Promise<ImportOutcome> {
	const sequelize = ImportBatch.sequelize!;
	const tally: ImportTally = {
		rowsRead: 0,
		rowsWritten: 0,
		rowsRejected: 0,
		bytesRead: 0,
		rejected: new RejectedRows(job.cells?.rowWord),
		headers: job.cells?.headers ?? [],
		smallCovers: 0,
		covers: new CoverCollector(),
		sourceWarnings: []
	};
	let transaction: Transaction | null = null;
	let writer: ReadingWriter | null = null;
	try {
		transaction = await sequelize.transaction();
		const connection = connectionOf(transaction);
		const method = job.writeMethod ?? (await chooseWriteMethod(connection));
		writer = new ReadingWriter(
			connection,
			method,
			job.batchId,
			job.flags ?? 0,
			method === 'load-data' ? IMPORT_LIMITS.loadDataChunkRows : IMPORT_LIMITS.insertChunkRows,
			mappedColumns(job.mapping)
		);
		const connectionId = connection.threadId ?? undefined;
		await job.claim?.(transaction);
		await tickProgress(job.batchId, tally, connectionId);
		await streamRows(job, writer, tally, connectionId);
		const idRange = await writer.finish();
		tally.rowsWritten = writer.rowsWritten;
		// A cancel asked for after the last progress report (while the last rows were read and
		// written) still wins: nothing commits. Only the commit itself is past cancelling.
		if (await tickProgress(job.batchId, tally, connectionId)) {
			throw new ImportError('cancelled', CANCELLED);
		}
		return await finishImport(job, tally, transaction, idRange);
	} catch (err) {
		await writer?.abort();
		if (transaction && !(transaction as unknown as { finished?: string }).finished) {
			await transaction.rollback().catch(() => undefined);
		}
		return failImport(job, tally, err);
	}
}

function messageFor(err: unknown): { message: string; state: 'failed' | 'cancelled' } {
	if (err instanceof ImportError) {
		return { message: err.message, state: err.code === 'cancelled' ? 'cancelled' : 'failed' };
	}
	const lost = /connection|socket|killed|ECONNRESET|closed/i.test(String((err as Error)?.message));
	if (!lost) console.error('import failed unexpectedly:', err);
	return {
		state: 'failed',
		message: lost
			? 'The connection to the database was lost during the import; nothing was written. Start the import again.'
			: 'The import failed because of an error on our side; nothing was written. Try again, and tell us if it happens again.'
	};
}

export async function failImport(
	job: Pick<ImportJob, 'batchId' | 'organisationId' | 'userId'>,
	tally: Pick<ImportTally, 'rowsRead' | 'rejected' | 'headers'>,
	err: unknown
): Promise<ImportOutcome> {
	const { message, state } = messageFor(err);
	// Only while still running: another process's sweep may already have failed this batch
	// (its connection was killed), and one audit event is enough.
	const [updated] = await ImportBatch.update(
		{
			state,
			errorMessage: message.slice(0, 1000),
			rowsTotal: tally.rowsRead,
			rowsImported: 0,
			rowsRejected: tally.rejected.count,
			rejectedRowsCsv: tally.rejected.toCsv(tally.headers),
			finishedAt: new Date()
		},
		{ where: { id: job.batchId, state: 'running' } }
	);
	if (updated === 0) {
		return { state, message, rowsImported: 0, rowsRejected: tally.rejected.count, warnings: [] };
	}
	await recordAudit({
		action: `import.${state}`,
		organisationId: job.organisationId,
		userId: job.userId,
		subjectType: 'import_batch',
		subjectId: job.batchId,
		detail: { rowsRead: tally.rowsRead, message }
	});
	return { state, message, rowsImported: 0, rowsRejected: tally.rejected.count, warnings: [] };
}
