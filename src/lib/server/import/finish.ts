import type { Transaction } from 'sequelize';
import { counted } from '$lib/format';
import { ImportBatch } from '../db/models';
import type { ImportState } from '../db/models/ImportBatch';
import { recordAudit } from '../audit';
import { mergeIntoCoverCounts } from '../readings/coverSets';
import { ImportError } from './errors';
import { unitOf } from './mapping';
import type { ImportJob, ImportTally } from './job';

export interface ImportOutcome {
	state: ImportState;
	message: string;
	rowsImported: number;
	rowsRejected: number;
	warnings: string[];
}

/** Share of covers below 4 mm above which the file was most likely written in inches. */
const INCH_SUSPICION_SHARE = 0.9;
const DELIMITER_NAMES: Record<string, string> = {
	',': 'comma',
	';': 'semicolon',
	'\t': 'tab',
	'|': 'bar'
};

function smallCoverShare(tally: ImportTally): number {
	const valid = tally.rowsRead - tally.rejected.count;
	return valid >= 5 ? tally.smallCovers / valid : 0;
}

/** A reason the batch must not be committed, in words the user can act on; null if none. */
export function blockingProblem(job: ImportJob, tally: ImportTally): ImportError | null {
	const { rejected, rowsRead } = tally;
	if (rowsRead === 0) {
		return tally.headers.length > 0
			? new ImportError('header-only', 'The file has a header row but no readings under it.')
			: new ImportError('empty-file', 'The file is empty: it holds no rows of readings.');
	}
	const [top] = rejected.summary(1);
	if (top?.code === 'width' && top.count === rowsRead && job.format === 'csv') {
		const name = DELIMITER_NAMES[job.options.delimiter] ?? job.options.delimiter;
		return new ImportError(
			'wrong-delimiter',
			`No row splits into the mapped columns at the ${name} delimiter: the file seems to use another delimiter. Check the delimiter and import again; nothing was written.`
		);
	}
	if (job.options.failingRows === 'reject-file' && rejected.count > 0) {
		return new ImportError(
			'rows-rejected',
			`${rejected.count} of ${rowsRead} rows failed the checks, so nothing was imported (the choice was to reject the whole file). ${rejected.describe()} Download the rejected rows to see each reason.`
		);
	}
	if (rejected.count === rowsRead) {
		return new ImportError(
			'all-rejected',
			`None of the ${rowsRead} rows could be imported. ${rejected.describe()}`
		);
	}
	const share = smallCoverShare(tally);
	if (
		unitOf(job.options, 'cover') === 'mm' &&
		!job.options.acceptSmallCovers &&
		share >= INCH_SUSPICION_SHARE
	) {
		return new ImportError(
			'inch-as-mm',
			`Nearly all covers (${Math.round(share * 100)}%) are below 4 mm: were they measured in inches? Choose inch units, or confirm that the covers really are this small, and import again. Nothing was written.`
		);
	}
	return null;
}

function warningsFor(job: ImportJob, tally: ImportTally): string[] {
	const warnings: string[] = [...tally.sourceWarnings];
	if (tally.rejected.count > 0) {
		warnings.push(
			`${counted(tally.rejected.count, 'row was', 'rows were')} not imported; download the rejected rows to see why. ${tally.rejected.describe()}`
		);
	}
	if (unitOf(job.options, 'cover') === 'mm' && smallCoverShare(tally) >= INCH_SUSPICION_SHARE) {
		warnings.push('Nearly all covers are below 4 mm; imported as mm because this was confirmed.');
	}
	return warnings;
}

/**
 * Commits the batch with its final state, the members' cover counts and its audit event, or
 * throws the blocking problem.
 */
export async function finishImport(
	job: ImportJob,
	tally: ImportTally,
	transaction: Transaction,
	idRange: { firstReadingId: number; lastReadingId: number } | null
): Promise<ImportOutcome> {
	const problem = blockingProblem(job, tally);
	if (problem) throw problem;
	const warnings = warningsFor(job, tally);
	await mergeIntoCoverCounts(transaction, tally.covers.sortedByMember());
	// Only from running: a batch another process has meanwhile failed (its sweep saw a stopped
	// heartbeat) or that was never claimed is not completed behind its back.
	const [updated] = await ImportBatch.update(
		{
			state: 'completed',
			firstReadingId: idRange?.firstReadingId ?? null,
			lastReadingId: idRange?.lastReadingId ?? null,
			rowsTotal: tally.rowsRead,
			rowsImported: tally.rowsWritten,
			rowsRejected: tally.rejected.count,
			rejectedRowsCsv: tally.rejected.toCsv(tally.headers),
			warnings,
			errorMessage: null,
			finishedAt: new Date()
		},
		{ where: { id: job.batchId, state: 'running' }, transaction }
	);
	if (updated !== 1) {
		throw new ImportError(
			'not-running',
			'This import was stopped by another process while it ran, so nothing was written. Start it again from a new upload.'
		);
	}
	await recordAudit(
		{
			action: 'import.completed',
			organisationId: job.organisationId,
			userId: job.userId,
			subjectType: 'import_batch',
			subjectId: job.batchId,
			detail: { rowsImported: tally.rowsWritten, rowsRejected: tally.rejected.count }
		},
		transaction
	);
	await transaction.commit();
	const message = `${counted(tally.rowsWritten, 'reading')} imported.`;
	return {
		state: 'completed',
		message,
		rowsImported: tally.rowsWritten,
		rowsRejected: tally.rejected.count,
		warnings
	};
}
