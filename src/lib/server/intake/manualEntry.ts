import type { Transaction } from 'sequelize';
import { z } from 'zod';
import { ImportBatch, type Survey } from '../db/models';
import { READING_FLAGS } from '../db/models/Reading';
import { manualEntrySchema, manualReadingSchema } from '$lib/intake/schemas';
import { importOptionsSchema, columnMappingSchema } from '../import/mapping';
import { beginProgress } from '../import/progress';
import { gridBytes, runImport } from '../import/run';
import type { Actor } from '../policy';
import { scopedMember } from '../access';
import { assertSurveyEditable } from './frozen';

const COLUMNS = ['memberLabel', 'x', 'y', 'cover', 'diameter', 'direction', 'note'] as const;

export type GridReading = z.infer<typeof manualReadingSchema> & { memberLabel: string };

/**
 * Readings from a grid (the member entry grid, a device's site entries) written through the
 * import path itself: the same row checks, one transaction, a batch that can be undone, all or
 * nothing. The rows go to the row checks as cells, and row numbers in messages are the grid's
 * (1 = the first reading).
 */
export async function importGridRows(input: {
	actor: Actor;
	survey: Survey;
	fileName: string;
	units: 'mm' | 'inch';
	rows: GridReading[];
	claim?: (transaction: Transaction) => Promise<void>;
}) {
	const { actor, survey } = input;
	const rows = input.rows.map((r) => COLUMNS.map((c) => r[c]));
	const batch = await ImportBatch.create({
		surveyId: survey.id,
		createdByUserId: actor.userId,
		sourceFormat: 'manual',
		fileName: input.fileName.slice(0, 255)
	});
	const mapping = columnMappingSchema.parse({
		memberLabel: 0,
		x: 1,
		y: 2,
		cover: 3,
		diameter: 4,
		direction: 5,
		note: 6
	});
	const options = importOptionsSchema.parse({
		units: input.units,
		failingRows: 'reject-file',
		headerRowIndex: -1
	});
	await batch.update({ mapping, options, state: 'running' });
	await beginProgress(batch.id, gridBytes(rows));
	const outcome = await runImport({
		batchId: batch.id,
		surveyId: survey.id,
		organisationId: actor.organisationId,
		userId: actor.userId,
		format: 'csv',
		cells: { headers: [...COLUMNS], rows, rowWord: 'Grid row' },
		mapping,
		options,
		flags: READING_FLAGS.manual,
		claim: input.claim
	});
	return { batchId: batch.id, ...outcome };
}

/** Readings typed or pasted into the entry grid for one member. */
export async function saveManualReadings(
	actor: Actor,
	memberId: number,
	entry: z.infer<typeof manualEntrySchema>
) {
	const { member, survey } = await scopedMember(actor, memberId, 'write');
	assertSurveyEditable(survey);
	return importGridRows({
		actor,
		survey,
		fileName: `entry for ${member.label}`,
		units: entry.units,
		rows: entry.rows.map((r) => ({ ...r, memberLabel: member.label }))
	});
}
