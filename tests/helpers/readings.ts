/**
 * Readings written straight into the database for tests that need "a later import" without the
 * upload pages, kept as the import keeps them: one transaction with a batch, its id range and
 * the members' summary rows (src/lib/server/readings/coverSets.ts).
 */
import { QueryTypes } from 'sequelize';
import { ImportBatch, Reading } from '../../src/lib/server/db/models';
import { READING_INSERT_FIELDS } from '../../src/lib/server/db/models/Reading';
import { rebuildCoverCounts } from '../../src/lib/server/readings/coverSets';

export interface TestReading {
	xMm: number;
	yMm: number;
	coverMm: number;
}

/** A completed batch of `readings` into one member; answers the batch id. */
export async function addReadings(
	surveyId: number,
	memberId: number,
	readings: readonly TestReading[],
	fileName: string | null = null
): Promise<number> {
	const sequelize = Reading.sequelize!;
	return sequelize.transaction(async (transaction) => {
		const batch = await ImportBatch.create(
			{
				surveyId,
				createdByUserId: null,
				sourceFormat: 'manual',
				fileName,
				fileSha256: null,
				fileBytes: null,
				state: 'completed',
				rowsTotal: readings.length,
				rowsImported: readings.length
			},
			{ transaction }
		);
		await Reading.bulkCreate(
			readings.map((r) => ({
				...r,
				memberId,
				importBatchId: batch.id,
				barDiameterMm: null,
				barSpacingMm: null,
				barDirection: null,
				note: null
			})),
			{ transaction, fields: [...READING_INSERT_FIELDS] }
		);
		const [range] = await sequelize.query<{ first: number; last: number }>(
			'SELECT MIN(id) AS first, MAX(id) AS last FROM readings WHERE member_id = ? AND import_batch_id = ?',
			{ replacements: [memberId, batch.id], type: QueryTypes.SELECT, transaction }
		);
		await batch.update({ firstReadingId: range.first, lastReadingId: range.last }, { transaction });
		await rebuildCoverCounts(transaction, [memberId]);
		return batch.id;
	});
}

/** Takes a batch from addReadings away again (readings, summary rows, the batch itself). */
export async function removeReadings(batchId: number): Promise<void> {
	const sequelize = Reading.sequelize!;
	await sequelize.transaction(async (transaction) => {
		const rows = await Reading.findAll({
			attributes: ['memberId'],
			where: { importBatchId: batchId },
			group: ['memberId'],
			raw: true,
			transaction
		});
		await Reading.destroy({ where: { importBatchId: batchId }, transaction });
		await rebuildCoverCounts(
			transaction,
			rows.map((r) => r.memberId)
		);
		await ImportBatch.destroy({ where: { id: batchId }, transaction });
	});
}
