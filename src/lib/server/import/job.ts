import type { Readable } from 'node:stream';
import type { Transaction } from 'sequelize';
import type { CoverCollector } from '../readings/coverCollector';
import type { ColumnMapping, ImportOptions } from './mapping';
import type { ProgressCounts } from './progress';
import type { RejectedRows } from './rejected';
import type { SourceFormat } from './sniff';
import type { WriteMethod } from './writer';

/**
 * One import's inputs and running tallies, shared by the pass over the file (run.ts) and its
 * ending (finish.ts); kept apart so neither of those imports the other.
 */

export interface ImportJob {
	batchId: number;
	surveyId: number;
	organisationId: number;
	userId: number | null;
	format: SourceFormat;
	/** Opens the file from its start (a staged file, or any stream in the benchmark); absent when `cells` are given. */
	open?: () => Readable;
	/**
	 * Rows already split into cells, read instead of the file (the entry grid, a device's site
	 * entries): nothing is written out as text to be parsed again. Row numbers are the grid's own
	 * (1 = the first reading) and messages call them `rowWord` ("Grid row 2").
	 */
	cells?: { headers: string[]; rows: string[][]; rowWord: string };
	mapping: ColumnMapping;
	options: ImportOptions;
	/** Reading flags for every row (READING_FLAGS.manual for the entry grid). */
	flags?: number;
	/** How rows reach the table; chosen from the server's settings when absent (tests set it). */
	writeMethod?: WriteMethod;
	/**
	 * Runs first inside the import's transaction, so what it writes commits with the readings or
	 * not at all: a site sync takes its batch id (a unique key, so a doubled send waits here and
	 * then fails) and records its holes. It throws ImportError to refuse the batch.
	 */
	claim?: (transaction: Transaction) => Promise<void>;
}

/** Tallies of one pass over the file. */
export interface ImportTally extends ProgressCounts {
	rejected: RejectedRows;
	headers: string[];
	smallCovers: number;
	/** The covers written, by member, for the members' cover counts. */
	covers: CoverCollector;
	/** What the reader noticed about the file as a whole (other sheets of a workbook). */
	sourceWarnings: string[];
}
