import { z } from 'zod';
import { DELIMITERS, ENCODINGS } from './detect';
import { IMPORT_LIMITS } from './limits';
import { MM_PER_INCH } from './numbers';

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

/** The mapped fields that hold lengths, each read in a unit of its own. */
export const LENGTH_FIELDS = ['x', 'y', 'cover', 'diameter', 'spacing'] as const;
export type LengthField = (typeof LENGTH_FIELDS)[number];
export const LENGTH_UNITS = ['mm', 'm', 'inch'] as const;
export type LengthUnit = (typeof LENGTH_UNITS)[number];

/** Millimetres in one unit of a length column. */
export const MM_PER_UNIT: Record<LengthUnit, number> = { mm: 1, m: 1000, inch: MM_PER_INCH };

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
		/** The unit of every length column that columnUnits does not name. */
		units: z.enum(LENGTH_UNITS).default('mm'),
		/** A unit per length column where it differs ("Position (m)" next to "Cover (mm)"). */
		columnUnits: z.partialRecord(z.enum(LENGTH_FIELDS), z.enum(LENGTH_UNITS)).default({}),
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
	kind: z
		.enum(['readings', 'carbonation', 'chloride'])
		.default('readings')
		.describe(
			'What the file holds: cover readings, carbonation tests (one a row) or chloride profiles (one depth increment a row).'
		),
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
	[
		'x',
		/^\s*x\b|x[\s_(-]*(mm|in|pos|coord)|^pos(ition)?\s*x|^\s*pos(ition)?\s*([([]|$)|easting|chainage/i
	],
	['y', /^\s*y\b|y[\s_(-]*(mm|in|pos|coord)|^pos(ition)?\s*y|height|elevation|northing/i],
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

/** The unit a length column is read in. */
export function unitOf(options: Pick<ImportOptions, 'units' | 'columnUnits'>, field: LengthField) {
	return options.columnUnits?.[field] ?? options.units;
}

/** A unit written in a header, as in "Position (m)", "cover [mm]", "X_in", "depth inches". */
export function unitInHeader(header: string): LengthUnit | null {
	const h = header.toLowerCase();
	const words = h.split(/[^a-z]+/).filter(Boolean);
	const last = words.at(-1);
	const has = (...names: string[]) => words.some((w) => names.includes(w));
	if (has('mm', 'millimetre', 'millimetres', 'millimeter', 'millimeters')) return 'mm';
	// A bare "m" or "in" only in brackets or as the last word ("x_m"): "in" is also a preposition.
	if (has('metre', 'metres', 'meter', 'meters') || /[([]\s*m\s*[)\]]/.test(h) || last === 'm')
		return 'm';
	if (
		has('inch', 'inches') ||
		/[([]\s*in\s*[)\]]|["″]/.test(h) ||
		(last === 'in' && words.length > 1)
	)
		return 'inch';
	return null;
}

/** The unit each mapped length column's header names; the user checks and changes it. */
export function suggestUnits(
	headers: readonly string[],
	mapping: Partial<Record<ReadingField, number>>
): Partial<Record<LengthField, LengthUnit>> {
	const units: Partial<Record<LengthField, LengthUnit>> = {};
	for (const field of LENGTH_FIELDS) {
		const index = mapping[field];
		const unit = index == null ? null : unitInHeader(headers[index] ?? '');
		if (unit) units[field] = unit;
	}
	return units;
}

/** Normalised header row: a saved template is offered when a new file's signature matches. */
export function headerSignature(headers: readonly string[]): string {
	return headers
		.map((h) => h.trim().toLowerCase().replace(/\s+/g, ' '))
		.join('|')
		.slice(0, 1000);
}
