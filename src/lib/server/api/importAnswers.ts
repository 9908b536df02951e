import { z } from 'zod';
import { IMPORT_STATES } from '$lib/words';
import type { ImportStatus } from '../import/batchActions';
import type { UploadResult } from '../import/batches';
import type { CheckedRow } from '../import/checkRows';
import type { ImportOutcome } from '../import/finish';
import {
	columnMappingSchema,
	importOptionsSchema,
	LENGTH_FIELDS,
	LENGTH_UNITS,
	READING_FIELDS
} from '../import/mapping';
import { isoTime } from './intakeAnswers';

/**
 * Shapes of the import routes' answers, for the OpenAPI document. Each is checked against the
 * code's own type when compiled (`satisfies`), and against the route's answer by the test.
 */
type Json<T> = T extends Date
	? string
	: T extends (infer U)[]
		? Json<U>[]
		: T extends object
			? { [K in keyof T]: Json<T[K]> }
			: T;

const state = z.enum(IMPORT_STATES);
const column = z.number().int().min(0);

const previewSchema = z.object({
	format: z.enum(['csv', 'xlsx']).describe('Judged from the bytes.'),
	settings: importOptionsSchema
		.pick({ encoding: true, delimiter: true, decimalMark: true, headerRowIndex: true })
		.extend({ mixedDecimalMarks: z.boolean() })
		.describe('Detected; send them back (changed if need be) in the start options.'),
	headers: z.array(z.string()),
	rows: z.array(z.array(z.string())).describe('The first data rows as text.'),
	suggestedMapping: z
		.record(z.string(), column)
		.describe(
			`For readings, of the fields ${READING_FIELDS.join(', ')}; for measurements, of the columns the help text lists.`
		),
	suggestedUnits: z
		.partialRecord(z.enum(LENGTH_FIELDS), z.enum(LENGTH_UNITS))
		.describe(
			'The unit named in each suggested length column\'s header ("Position (m)" → m); send the units chosen in options.columnUnits.'
		),
	headerSignature: z.string(),
	warnings: z.array(z.string())
});

export const uploadAnswerSchema = z
	.object({
		batchId: z
			.number()
			.int()
			.describe('The import; start it with POST /api/v1/imports/{batchId}/start.'),
		preview: previewSchema,
		duplicateOf: z
			.object({
				batchId: z.number().int(),
				surveyId: z.number().int(),
				fileName: z.string().nullable(),
				importedAt: isoTime,
				rowsImported: z.number().int()
			})
			.nullable()
			.describe('An earlier completed import of the same bytes (sha256) into this asset.'),
		templates: z
			.array(
				z.object({
					id: z.number().int(),
					name: z.string(),
					mapping: columnMappingSchema,
					options: importOptionsSchema
				})
			)
			.describe("Your organisation's saved mappings for files with these headers.")
	})
	.meta({ id: 'ImportUpload' }) satisfies z.ZodType<Json<UploadResult>>;

export const importStatusSchema = z
	.object({
		id: z.number().int(),
		surveyId: z.number().int(),
		state,
		kind: z.string().describe('readings, carbonation or chloride: what the file held.'),
		fileName: z.string().nullable(),
		sourceFormat: z.string().describe('csv, xlsx, or manual (the entry grid).'),
		rowsTotal: z.number().int(),
		rowsImported: z.number().int(),
		rowsRejected: z.number().int(),
		errorMessage: z.string().nullable(),
		warnings: z.array(z.string()),
		hasRejectedRows: z.boolean().describe('GET /api/v1/imports/{batchId}/rejected has them.'),
		createdAt: isoTime,
		finishedAt: isoTime.nullable(),
		progress: z
			.object({
				rowsRead: z.number().int(),
				bytesRead: z.number().int(),
				bytesTotal: z.number().int(),
				fraction: z.number().min(0).max(1)
			})
			.nullable()
			.describe('While running; null otherwise.')
	})
	.meta({ id: 'ImportStatus' }) satisfies z.ZodType<Json<ImportStatus>>;

export const importCheckAnswerSchema = z
	.object({
		rows: z.array(
			z.union([
				z.object({
					ok: z.literal(true),
					reading: z.object({
						memberLabel: z.string(),
						xMm: z.number().nullable(),
						yMm: z.number().nullable(),
						coverMm: z.number(),
						barDiameterMm: z.number().nullable(),
						barSpacingMm: z.number().nullable(),
						barDirection: z.string().nullable(),
						note: z.string().nullable()
					})
				}),
				z.object({ ok: z.literal(false), reason: z.string() })
			])
		)
	})
	.meta({ id: 'ImportCheck' }) satisfies z.ZodType<Json<{ rows: CheckedRow[] }>>;

export const importStatusAnswerSchema = z.object({ import: importStatusSchema });
export const importStartedSchema = z.object({
	import: z.object({ id: z.number().int(), state: z.literal('running') })
});
export const cancelRequestedSchema = z.object({ cancelRequested: z.literal(true) });
export const undoneSchema = z.object({
	rowsDeleted: z.number().int().describe("Readings removed: exactly the import's.")
});

export const manualEntryAnswerSchema = z
	.object({
		batchId: z.number().int().describe('The entry is an import: it can be undone like one.'),
		state: z.literal('completed'),
		message: z.string(),
		rowsImported: z.number().int(),
		rowsRejected: z.number().int(),
		warnings: z.array(z.string())
	})
	.meta({ id: 'ManualEntry' }) satisfies z.ZodType<Json<ImportOutcome & { batchId: number }>>;
