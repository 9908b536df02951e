import { Readable } from 'node:stream';
import Papa from 'papaparse';
import { z } from 'zod';
import { ImportBatch } from '../db/models';
import { READING_FLAGS } from '../db/models/Reading';
import { manualEntrySchema } from '$lib/intake/schemas';
import { importOptionsSchema, columnMappingSchema } from '../import/mapping';
import { beginProgress } from '../import/progress';
import { runImport } from '../import/run';
import type { Actor } from '../policy';
import { scopedMember } from '../scope';
import { assertSurveyEditable } from './frozen';

const COLUMNS = ['x', 'y', 'cover', 'diameter', 'direction', 'note'] as const;

/**
 * Readings typed or pasted into the entry grid for one member. They go through the import
 * path itself (same checks, one transaction, a batch that can be undone), all or nothing.
 */
export async function saveManualReadings(
	actor: Actor,
	memberId: number,
	entry: z.infer<typeof manualEntrySchema>
) {
	const { member, survey } = await scopedMember(actor, memberId, 'write');
	assertSurveyEditable(survey);
	const text = Papa.unparse({
		fields: [...COLUMNS],
		data: entry.rows.map((r) => COLUMNS.map((c) => r[c]))
	});
	const batch = await ImportBatch.create({
		surveyId: survey.id,
		createdByUserId: actor.userId,
		sourceFormat: 'manual',
		fileName: `entry for ${member.label}`.slice(0, 255)
	});
	const mapping = columnMappingSchema.parse({
		x: 0,
		y: 1,
		cover: 2,
		diameter: 3,
		direction: 4,
		note: 5
	});
	const options = importOptionsSchema.parse({
		units: entry.units,
		failingRows: 'reject-file',
		fixedMemberLabel: member.label,
		headerRowIndex: 0
	});
	await batch.update({ mapping, options, state: 'running' });
	await beginProgress(batch.id, Buffer.byteLength(text));
	const outcome = await runImport({
		batchId: batch.id,
		surveyId: survey.id,
		organisationId: actor.organisationId,
		userId: actor.userId,
		format: 'csv',
		open: () => Readable.from([Buffer.from(text)]),
		mapping,
		options,
		flags: READING_FLAGS.manual
	});
	// Row numbers count the header line the grid's rows were written under: say grid rows.
	const message = outcome.message.replace(/\bRow (\d+)/g, (_m, n) => `Grid row ${Number(n) - 1}`);
	return { batchId: batch.id, ...outcome, message };
}
