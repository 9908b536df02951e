import type { CheckedRow } from '$lib/intake/checkedRow';
import { z } from 'zod';
import type { Actor } from '../policy';
import { scopedImportBatch } from '../access';
import { columnMappingSchema, importOptionsSchema } from './mapping';
import { extraFields, memberIndex } from './run';
import { createRowValidator } from './validateRow';

/** The preview's rows with a mapping and options the user has not started the import with yet. */
export const importCheckSchema = z.object({
	mapping: columnMappingSchema,
	options: importOptionsSchema,
	headers: z.array(z.string().max(1000)).max(256).describe("The preview's headers."),
	rows: z
		.array(z.array(z.string().max(16_384)).max(256))
		.max(20)
		.describe("The preview's first rows, as the upload answered them.")
});
export type { CheckedRow };
export type ImportCheckInput = z.infer<typeof importCheckSchema>;

/**
 * The preview's first rows as the import would read them with this mapping and these units:
 * the same row checks as the import itself, so what the preview shows is what is written.
 */
export async function checkPreviewRows(
	actor: Actor,
	batchId: number,
	input: ImportCheckInput
): Promise<CheckedRow[]> {
	const { batch, survey } = await scopedImportBatch(actor, batchId, 'read');
	const members = await memberIndex(survey.id);
	const validate = createRowValidator(input.mapping, input.options, members);
	const format = batch.sourceFormat === 'xlsx' ? 'xlsx' : 'csv';
	return input.rows.map((cells) => {
		const result = extraFields(format, input.headers, cells) ?? validate(cells);
		if (!result.ok) return { ok: false, reason: result.reason };
		const { memberId: _id, ...reading } = result.reading;
		const column = input.mapping.memberLabel;
		const memberLabel =
			column == null ? (input.options.fixedMemberLabel ?? '') : (cells[column] ?? '').trim();
		return { ok: true, reading: { memberLabel, ...reading } };
	});
}
