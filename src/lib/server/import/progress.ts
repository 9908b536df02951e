import type { Transaction } from 'sequelize';
import { ImportProgress } from '../db/models';

export interface ProgressCounts {
	rowsRead: number;
	rowsWritten: number;
	rowsRejected: number;
	bytesRead: number;
}

export async function beginProgress(
	batchId: number,
	bytesTotal: number,
	transaction?: Transaction
): Promise<void> {
	await ImportProgress.upsert(
		{
			importBatchId: batchId,
			bytesTotal,
			rowsRead: 0,
			rowsWritten: 0,
			rowsRejected: 0,
			bytesRead: 0,
			cancelRequested: false,
			heartbeatAt: new Date()
		},
		{ transaction }
	);
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

// Where a stopped heartbeat or a vanished connection is judged (callers import it from here).
export { failAbandonedImports } from './abandoned';
