import { ImportBatch, ImportProgress, Reading } from '../db/models';
import { recordAudit } from '../audit';
import { StateError } from '../domainErrors';
import { assertSurveyEditable } from '../intake/frozen';
import type { Actor } from '../policy';
import { scopedImportBatch, scopedSurvey } from '../scope';
import { stagedPathOf } from './batches';
import { failAbandonedImports, requestCancel } from './progress';
import { removeStaged } from './stage';

/** Cancels a pending import at once, or asks a running one to stop (it rolls back). */
export async function cancelImport(actor: Actor, batchId: number): Promise<void> {
	const { batch } = await scopedImportBatch(actor, batchId, 'write');
	if (batch.state === 'pending') {
		await batch.update({ state: 'cancelled', finishedAt: new Date() });
		await removeStaged(stagedPathOf(batch.id));
		return;
	}
	if (batch.state !== 'running') throw new StateError(`This import is already ${batch.state}.`);
	await requestCancel(batch.id);
}

/** Removes exactly the readings a completed import wrote, with an audit event, in one step. */
export async function undoImport(actor: Actor, batchId: number): Promise<number> {
	const { batch, survey } = await scopedImportBatch(actor, batchId, 'write');
	assertSurveyEditable(survey);
	if (batch.state !== 'completed') {
		throw new StateError(`Only a completed import can be undone; this one is ${batch.state}.`);
	}
	const sequelize = ImportBatch.sequelize!;
	return sequelize.transaction(async (transaction) => {
		const deleted = await Reading.destroy({ where: { importBatchId: batch.id }, transaction });
		await batch.update(
			{ state: 'undone', undoneAt: new Date(), undoneByUserId: actor.userId },
			{ transaction }
		);
		await recordAudit(
			{
				action: 'import.undone',
				organisationId: actor.organisationId,
				userId: actor.userId,
				subjectType: 'import_batch',
				subjectId: batch.id,
				detail: { rowsDeleted: deleted, fileName: batch.fileName }
			},
			transaction
		);
		return deleted;
	});
}

export interface ImportStatus {
	id: number;
	surveyId: number;
	state: string;
	fileName: string | null;
	sourceFormat: string;
	rowsTotal: number;
	rowsImported: number;
	rowsRejected: number;
	errorMessage: string | null;
	warnings: string[];
	hasRejectedRows: boolean;
	createdAt: Date;
	finishedAt: Date | null;
	progress: { rowsRead: number; bytesRead: number; bytesTotal: number; fraction: number } | null;
}

function statusOf(batch: ImportBatch, progress: ImportProgress | null): ImportStatus {
	const live = batch.state === 'running' && progress;
	return {
		id: batch.id,
		surveyId: batch.surveyId,
		state: batch.state,
		fileName: batch.fileName,
		sourceFormat: batch.sourceFormat,
		rowsTotal: batch.rowsTotal,
		rowsImported: batch.rowsImported,
		rowsRejected: live ? progress.rowsRejected : batch.rowsRejected,
		errorMessage: batch.errorMessage,
		warnings: batch.warnings ?? [],
		hasRejectedRows: batch.rejectedRowsCsv != null,
		createdAt: batch.createdAt,
		finishedAt: batch.finishedAt,
		progress: live
			? {
					rowsRead: progress.rowsRead,
					bytesRead: progress.bytesRead,
					bytesTotal: progress.bytesTotal,
					fraction: progress.bytesTotal ? Math.min(1, progress.bytesRead / progress.bytesTotal) : 0
				}
			: null
	};
}

/** The state and progress of an import, as any app process can read it from MariaDB. */
export async function importStatus(actor: Actor, batchId: number): Promise<ImportStatus> {
	await failAbandonedImports();
	const { batch } = await scopedImportBatch(actor, batchId, 'read');
	await batch.reload({ attributes: { exclude: [] } });
	return statusOf(batch, await ImportProgress.findByPk(batch.id));
}

export async function listImports(actor: Actor, surveyId: number): Promise<ImportStatus[]> {
	await scopedSurvey(actor, surveyId, 'read');
	await failAbandonedImports();
	const batches = await ImportBatch.findAll({ where: { surveyId }, order: [['id', 'DESC']] });
	const progress = await ImportProgress.findAll({
		where: { importBatchId: batches.map((b) => b.id) }
	});
	const byId = new Map(progress.map((p) => [p.importBatchId, p]));
	return batches.map((b) => statusOf(b, byId.get(b.id) ?? null));
}

export async function rejectedRowsCsv(actor: Actor, batchId: number): Promise<string | null> {
	const { batch } = await scopedImportBatch(actor, batchId, 'read');
	return batch.rejectedRowsCsv;
}
