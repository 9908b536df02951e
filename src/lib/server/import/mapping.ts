import { z } from 'zod';
import { DELIMITERS, ENCODINGS } from './detect';
import { IMPORT_LIMITS } from './limits';

/** The reading fields a file's columns can be mapped to. */
export const READING_FIELDS = [
	'memberLabel',
	'x',
	'y',
	'cover',
	'diameter',
	'spacing',
	'direction',
	'note'
] as const;
export type ReadingField = (typeof READING_FIELDS)[number];

export const FIELD_LABELS: Record<ReadingField, string> = {
	memberLabel: 'member label',
	x: 'x',
	y: 'y',
	cover: 'cover',
	diameter: 'bar diameter',
	spacing: 'bar spacing',
	direction: 'direction or layer',
	note: 'note'
};

const column = z.number().int().min(0).max(499).nullable().default(null);

/** Which column (0-based) holds each field; null when the file has no such column. */
export const columnMappingSchema = z
	.object({
		memberLabel: column,
		x: column,
		y: column,
		cover: z.number({ error: 'Choose the column that holds the cover.' }).int().min(0).max(499),
		diameter: column,
		spacing: column,
		direction: column,
		note: column
	})
	.strict();
export type ColumnMapping = z.infer<typeof columnMappingSchema>;

export const importOptionsSchema = z
	.object({
		units: z.enum(['mm', 'inch']).default('mm'),
		/** reject-file: one bad row and nothing is written; import-valid: bad rows come back. */
		failingRows: z.enum(['reject-file', 'import-valid']).default('reject-file'),
		coverMaxMm: z.number().positive().max(IMPORT_LIMITS.widenedCoverMaxMm).default(300),
		/** The user has seen the "nearly all covers below 4 mm" warning and the file is right. */
		acceptSmallCovers: z.boolean().default(false),
		/** All rows belong to this member when the file has no member column. */
		fixedMemberLabel: z.string().trim().min(1).max(80).nullable().default(null),
		encoding: z.enum(ENCODINGS).default('utf-8'),
		delimiter: z.enum(DELIMITERS).default(','),
		decimalMark: z.enum(['.', ',']).default('.'),
		headerRowIndex: z.number().int().min(-1).max(1000).default(0)
	})
	.strict();
export type ImportOptions = z.infer<typeof importOptionsSchema>;

/** Step 1's query: the file itself is the request body. */
export const importUploadQuerySchema = z.object({
	fileName: z
		.string()
		.default('readings.csv')
		.describe("The file's name (sanitised); its extension helps tell CSV from XLSX.")
});

/** Step 2: the mapping and choices the user confirmed against the preview. */
export const importStartSchema = z.object({
	mapping: columnMappingSchema,
	options: importOptionsSchema,
	confirmDuplicate: z
		.boolean()
		.default(false)
		.describe('Import a file already imported into this asset (same sha256) again.'),
	saveTemplateAs: z
		.string()
		.trim()
		.min(1)
		.max(80)
		.nullable()
		.default(null)
		.describe("Save the mapping and options under this name for your organisation's next files."),
	headerSignature: z
		.string()
		.max(1000)
		.optional()
		.describe("The preview's headerSignature, to offer the template when the headers match.")
});

const SUGGESTIONS: [ReadingField, RegExp][] = [
	['memberLabel', /member|element|label|bay|location|area/i],
	['cover', /cover|reading|depth/i],
	['x', /^\s*x\b|x[\s_(-]*(mm|in|pos|coord)|^pos(ition)?\s*x|easting|chainage/i],
	['y', /^\s*y\b|y[\s_(-]*(mm|in|pos|coord)|^pos(ition)?\s*y|northing/i],
	['diameter', /dia|bar\s*size|ø/i],
	['spacing', /spacing|pitch/i],
	['direction', /direction|layer|orient/i],
	['note', /note|comment|remark/i]
];

/** A first guess of the mapping from header names; the user checks and changes it. */
export function suggestMapping(headers: readonly string[]): Partial<Record<ReadingField, number>> {
	const mapping: Partial<Record<ReadingField, number>> = {};
	const taken = new Set<number>();
	for (const [field, pattern] of SUGGESTIONS) {
		const index = headers.findIndex((h, i) => !taken.has(i) && pattern.test(h));
		if (index >= 0) {
			mapping[field] = index;
			taken.add(index);
		}
	}
	return mapping;
}

/** Normalised header row: a saved template is offered when a new file's signature matches. */
export function headerSignature(headers: readonly string[]): string {
	return headers
		.map((h) => h.trim().toLowerCase().replace(/\s+/g, ' '))
		.join('|')
		.slice(0, 1000);
}
