import { QueryTypes } from 'sequelize';
import { ImportBatch, ImportProgress } from '../db/models';
import { IMPORT_LIMITS } from './limits';

export interface ProgressCounts {
	rowsRead: number;
	rowsWritten: number;
	rowsRejected: number;
	bytesRead: number;
}

export async function beginProgress(batchId: number, bytesTotal: number): Promise<void> {
	await ImportProgress.upsert({
		importBatchId: batchId,
		bytesTotal,
		rowsRead: 0,
		rowsWritten: 0,
		rowsRejected: 0,
		bytesRead: 0,
		cancelRequested: false,
		heartbeatAt: new Date()
	});
}

/** Records progress (on a pooled connection, outside the import's transaction) and says
 * whether a cancel was asked for meanwhile. */
export async function tickProgress(
	batchId: number,
	counts: ProgressCounts,
	connectionId?: number
): Promise<boolean> {
	await ImportProgress.update(
		{ ...counts, heartbeatAt: new Date(), ...(connectionId ? { connectionId } : {}) },
		{ where: { importBatchId: batchId } }
	);
	const row = await ImportProgress.findByPk(batchId, { attributes: ['cancelRequested'] });
	return row?.cancelRequested ?? false;
}

export async function requestCancel(batchId: number): Promise<void> {
	await ImportProgress.update({ cancelRequested: true }, { where: { importBatchId: batchId } });
}

/**
 * A running import whose heartbeat stopped belonged to a process that ended; MariaDB rolled its
 * transaction back when the connection closed, so it is failed with nothing written.
 */
export async function failAbandonedImports(): Promise<number> {
	const staleBefore = new Date(Date.now() - IMPORT_LIMITS.staleAfterMs);
	// A plain (non-locking) read first: an UPDATE scanning running batches would wait on the
	// lock a live import holds on its own batch row.
	const stale = await ImportProgress.sequelize!.query<{ importBatchId: number }>(
		`SELECT p.import_batch_id AS importBatchId FROM import_progress p
		 JOIN import_batches b ON b.id = p.import_batch_id
		 WHERE b.state = 'running' AND p.heartbeat_at < ?`,
		{ replacements: [staleBefore], type: QueryTypes.SELECT }
	);
	if (stale.length === 0) return 0;
	const [count] = await ImportBatch.update(
		{
			state: 'failed',
			finishedAt: new Date(),
			errorMessage:
				'The import stopped before it finished (the server handling it ended); nothing was written. Start it again.'
		},
		{ where: { id: stale.map((s) => s.importBatchId), state: 'running' } }
	);
	return count;
}
