import { Op, QueryTypes, type Transaction } from 'sequelize';
import {
	CarbonationTest,
	ChlorideIncrement,
	ChlorideProfile,
	ImportBatch,
	ImportProgress,
	Member,
	Reading
} from '../db/models';
import { rebuildCoverCounts } from '../readings/coverSets';
import { recordAudit } from '../audit';
import { StateError } from '../domainErrors';
import { assertSurveyEditable } from '../intake/frozen';
import type { Actor } from '../policy';
import { scopedImportBatch, scopedSurvey } from '../access';
import { failAbandonedImports, requestCancel } from './progress';
import { removeStagedCopies } from './stagedCopies';

/** Cancels a pending import at once, or asks a running one to stop (it rolls back). */
export async function cancelImport(actor: Actor, batchId: number): Promise<void> {
	const { batch } = await scopedImportBatch(actor, batchId, 'write');
	if (batch.state === 'pending') {
		// Conditional: a start that claimed the batch meanwhile is asked to stop instead.
		const [cancelled] = await ImportBatch.update(
			{ state: 'cancelled', finishedAt: new Date() },
			{ where: { id: batch.id, state: 'pending' } }
		);
		if (cancelled === 1) {
			await removeStagedCopies(batch.id);
			return;
		}
		await batch.reload();
	}
	if (batch.state !== 'running') throw new StateError(`This import is already ${batch.state}.`);
	await requestCancel(batch.id);
}

/**
 * Where a batch's readings are: among its survey's members (the leading part of the readings'
 * primary key) and, when the batch recorded it (migration 009), within its range of ids.
 */
function batchReadingsWhere(batch: ImportBatch, surveyMemberIds: number[]) {
	const members = surveyMemberIds.length ? surveyMemberIds : [0];
	const ranged = batch.firstReadingId != null && batch.lastReadingId != null;
	return {
		sql: `member_id IN (:members) AND import_batch_id = :batchId${ranged ? ' AND id BETWEEN :first AND :last' : ''}`,
		replacements: {
			members,
			batchId: batch.id,
			first: batch.firstReadingId,
			last: batch.lastReadingId
		},
		where: {
			memberId: members,
			importBatchId: batch.id,
			...(ranged ? { id: { [Op.between]: [batch.firstReadingId!, batch.lastReadingId!] } } : {})
		}
	};
}

/** Deletes the batch's readings and recounts the summary rows of the members they belonged to. */
async function deleteBatchReadings(batch: ImportBatch, transaction: Transaction): Promise<number> {
	const sequelize = ImportBatch.sequelize!;
	const members = await Member.findAll({
		attributes: ['id'],
		where: { surveyId: batch.surveyId },
		transaction
	});
	const where = batchReadingsWhere(
		batch,
		members.map((m) => m.id)
	);
	const touched = await sequelize.query<{ memberId: number }>(
		`SELECT DISTINCT member_id AS memberId FROM readings WHERE ${where.sql}`,
		{ type: QueryTypes.SELECT, replacements: where.replacements, transaction }
	);
	const deleted = await Reading.destroy({ where: where.where, transaction });
	await rebuildCoverCounts(
		transaction,
		touched.map((t) => t.memberId)
	);
	return deleted;
}

/** Deletes the carbonation tests or chloride profiles (with their increments) a batch wrote. */
async function deleteBatchMeasurements(
	batch: ImportBatch,
	transaction: Transaction
): Promise<number> {
	const where = { importBatchId: batch.id };
	if (batch.kind === 'carbonation') return CarbonationTest.destroy({ where, transaction });
	const profiles = await ChlorideProfile.findAll({ attributes: ['id'], where, transaction });
	await ChlorideIncrement.destroy({
		where: { profileId: profiles.map((p) => p.id) },
		transaction
	});
	return ChlorideProfile.destroy({ where, transaction });
}

/** Removes exactly the readings a completed import wrote, with an audit event, in one step. */
export async function undoImport(actor: Actor, batchId: number): Promise<number> {
	const { batch, survey } = await scopedImportBatch(actor, batchId, 'write');
	assertSurveyEditable(survey);
	const sequelize = ImportBatch.sequelize!;
	return sequelize.transaction(async (transaction) => {
		// Locked and checked inside the transaction: two undos at once must not both proceed.
		await batch.reload({ transaction, lock: transaction.LOCK.UPDATE });
		if (batch.state !== 'completed') {
			throw new StateError(`Only a completed import can be undone; this one is ${batch.state}.`);
		}
		const deleted =
			batch.kind === 'readings'
				? await deleteBatchReadings(batch, transaction)
				: await deleteBatchMeasurements(batch, transaction);
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
				detail: { rowsDeleted: deleted, kind: batch.kind, fileName: batch.fileName }
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
	/** What the file held: readings, carbonation tests or chloride profiles. */
	kind: string;
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
		kind: batch.kind,
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
