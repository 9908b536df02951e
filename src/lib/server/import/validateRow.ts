import { z } from 'zod';
import { counted } from '$lib/format';
import {
	FIELD_LABELS,
	LENGTH_FIELDS,
	MM_PER_UNIT,
	unitOf,
	type ColumnMapping,
	type ImportOptions,
	type LengthField,
	type ReadingField
} from './mapping';
import { parseDecimal } from './numbers';

/** A row ready for the readings table, lengths in mm. */
export interface ValidReading {
	memberId: number;
	xMm: number | null;
	yMm: number | null;
	coverMm: number;
	barDiameterMm: number | null;
	barSpacingMm: number | null;
	barDirection: string | null;
	note: string | null;
}

export type RowResult =
	{ ok: true; reading: ValidReading } | { ok: false; code: string; reason: string };

/** Member labels compare as MariaDB's utf8mb4_unicode_ci does for the unique index: no case. */
export const labelKey = (label: string) => label.trim().toLowerCase();

/** The error values a spreadsheet writes in place of a formula's result (ECMA-376 Part 1,
 * §18.17.7 error values, and the later #SPILL!, #CALC!). */
const SPREADSHEET_ERROR =
	/^#(?:DIV\/0!|N\/A|NAME\?|NULL!|NUM!|REF!|VALUE!|SPILL!|CALC!|GETTING_DATA)$/i;

type ReadingSchema = ReturnType<typeof readingSchema>;
type ReadingKey = keyof ReadingSchema['shape'];

/** Each field and the key the schema checks it under, in the order problems are reported. */
const SCHEMA_KEYS: [ReadingField, ReadingKey][] = [
	['memberLabel', 'memberLabel'],
	['cover', 'coverMm'],
	['x', 'xMm'],
	['y', 'yMm'],
	['diameter', 'barDiameterMm'],
	['spacing', 'barSpacingMm'],
	['direction', 'barDirection'],
	['note', 'note']
];

/** The rules of one reading, field by field. */
export function readingSchema(coverMaxMm: number) {
	const length = (label: string, min: number, max: number) =>
		z
			.number({ error: `${label} is not a number` })
			.min(min, { error: (i) => `${label} ${i.input} mm is below ${min} mm` })
			.max(max, { error: (i) => `${label} ${i.input} mm is above the ${max} mm limit` })
			.nullable();
	return z.object({
		memberLabel: z
			.string()
			.min(1, 'member label is empty')
			.max(80, 'member label is longer than 80 characters'),
		coverMm: z
			.number({ error: (i) => (i.input == null ? 'cover is empty' : 'cover is not a number') })
			.min(0, { error: (i) => `cover ${i.input} mm is negative` })
			.max(coverMaxMm, {
				error: (i) =>
					`cover ${i.input} mm is above the ${coverMaxMm} mm limit (widen the limit if it is right)`
			}),
		xMm: length('x', -1e7, 1e7),
		yMm: length('y', -1e7, 1e7),
		barDiameterMm: length('bar diameter', 1, 100),
		barSpacingMm: length('bar spacing', 1, 5000),
		barDirection: z.string().max(16, 'direction or layer is longer than 16 characters').nullable(),
		note: z.string().max(500, 'note is longer than 500 characters').nullable()
	});
}

/** What zod said about one value: nothing (it passes) or the first problem. */
type FieldVerdict = { code: string; reason: string } | null;

/** Distinct values remembered per field; past this a field's answers are no longer kept. */
const REMEMBERED_VALUES = 50_000;

/**
 * One field's zod schema with its answers remembered by value. A schema is a pure function of
 * the value (no transforms, no context), so a value seen before gets the same answer without
 * running zod again: cover meters repeat values (a 0.1 mm resolution, a few hundred labels and
 * grid positions), and zod's per-call work was ≈ 2 s of a million-row import (docs/performance.md).
 */
function rememberingCheck(key: ReadingKey, schema: z.ZodType) {
	const answers = new Map<string | number | null, FieldVerdict>();
	return (value: string | number | null): FieldVerdict => {
		const known = answers.get(value);
		if (known !== undefined) return known;
		const parsed = schema.safeParse(value);
		const issue = parsed.success ? null : parsed.error.issues[0];
		const verdict = issue ? { code: `${key}.${issue.code}`, reason: issue.message } : null;
		if (answers.size < REMEMBERED_VALUES) answers.set(value, verdict);
		return verdict;
	};
}

/**
 * Turns one record of text cells into a reading, or says in plain words what is wrong with it.
 * Numbers are read with the file's decimal mark and converted to mm; then every mapped field is
 * checked by its zod schema (readingSchema), and the label must name a member of the survey.
 * Unmapped fields are null by construction and not checked.
 */
export function createRowValidator(
	mapping: ColumnMapping,
	options: ImportOptions,
	members: ReadonlyMap<string, number>
): (cells: readonly string[]) => RowResult {
	const shape = readingSchema(options.coverMaxMm).shape;
	const isMapped = (field: ReadingField) => field === 'memberLabel' || mapping[field] != null;
	const checks = new Map(
		SCHEMA_KEYS.filter(([field]) => isMapped(field)).map(([, key]) => [
			key,
			rememberingCheck(key, shape[key])
		])
	);
	const noCheck = () => null;
	const checkOf = (key: ReadingKey) => checks.get(key) ?? noCheck;
	const [
		checkLabel,
		checkCover,
		checkX,
		checkY,
		checkDiameter,
		checkSpacing,
		checkDirection,
		checkNote
	] = SCHEMA_KEYS.map(([, key]) => checkOf(key));
	const [mappedX, mappedY, mappedDiameter, mappedSpacing, mappedDirection, mappedNote] = (
		['x', 'y', 'diameter', 'spacing', 'direction', 'note'] as const
	).map(isMapped);
	const toMm = {} as Record<LengthField, (value: number) => number>;
	for (const field of LENGTH_FIELDS) {
		const factor = MM_PER_UNIT[unitOf(options, field)];
		// Rounded to a millionth of a mm after converting: 0.035 m × 1000 and 1.5 in × 25.4 are
		// 35.00000000000001 and 38.099999999999994 in binary floating point.
		toMm[field] = factor === 1 ? (v) => v : (v) => Math.round(v * factor * 1e6) / 1e6;
	}
	const widthNeeded = Math.max(...Object.values(mapping).map((c) => (c ?? -1) + 1));
	const cell = (cells: readonly string[], field: ReadingField) => {
		const index = mapping[field];
		return index == null ? '' : (cells[index] ?? '');
	};
	const readLength = (cells: readonly string[], field: LengthField) => {
		const raw = cell(cells, field);
		const value = parseDecimal(raw, options.decimalMark);
		if (typeof value !== 'string') return value === null ? null : toMm[field](value);
		if (SPREADSHEET_ERROR.test(raw.trim())) {
			return {
				code: `${field}.spreadsheet-error`,
				reason: `${FIELD_LABELS[field]} holds the spreadsheet error ${raw.trim()} (a formula that failed in the spreadsheet), not a number`
			};
		}
		const what =
			value === 'wrong-decimal-mark'
				? `uses the wrong decimal mark (this import reads '${options.decimalMark}')`
				: 'is not a number';
		return { code: `${field}.${value}`, reason: `${FIELD_LABELS[field]} "${raw}" ${what}` };
	};
	/** Member ids by the label as written (labelKey folds case and spaces once per label). */
	const memberIdOf = new Map<string, number | undefined>();
	return (cells) => {
		if (cells.length < widthNeeded) {
			return {
				ok: false,
				code: 'width',
				reason: `the row has ${counted(cells.length, 'field')} but the mapping needs ${widthNeeded} (is the delimiter right?)`
			};
		}
		const coverMm = readLength(cells, 'cover');
		const xMm = mappedX ? readLength(cells, 'x') : null;
		const yMm = mappedY ? readLength(cells, 'y') : null;
		const barDiameterMm = mappedDiameter ? readLength(cells, 'diameter') : null;
		const barSpacingMm = mappedSpacing ? readLength(cells, 'spacing') : null;
		for (const v of [coverMm, xMm, yMm, barDiameterMm, barSpacingMm]) {
			if (v !== null && typeof v === 'object') return { ok: false, ...v };
		}
		const memberLabel =
			mapping.memberLabel == null
				? (options.fixedMemberLabel ?? '')
				: cell(cells, 'memberLabel').trim();
		const barDirection = mappedDirection ? cell(cells, 'direction').trim() || null : null;
		const note = mappedNote ? cell(cells, 'note').trim() || null : null;
		const problem =
			checkLabel(memberLabel) ??
			checkCover(coverMm as number | null) ??
			checkX(xMm as number | null) ??
			checkY(yMm as number | null) ??
			checkDiameter(barDiameterMm as number | null) ??
			checkSpacing(barSpacingMm as number | null) ??
			checkDirection(barDirection) ??
			checkNote(note);
		if (problem) return { ok: false, code: problem.code, reason: problem.reason };
		let memberId = memberIdOf.get(memberLabel);
		if (memberId === undefined && !memberIdOf.has(memberLabel)) {
			memberId = members.get(labelKey(memberLabel));
			if (memberIdOf.size < REMEMBERED_VALUES) memberIdOf.set(memberLabel, memberId);
		}
		if (memberId === undefined) {
			return {
				ok: false,
				code: 'member.unknown',
				reason: `member label "${memberLabel}" is not a member of this survey (add the member first, or check the label)`
			};
		}
		return {
			ok: true,
			reading: {
				memberId,
				xMm: xMm as number | null,
				yMm: yMm as number | null,
				coverMm: coverMm as number,
				barDiameterMm: barDiameterMm as number | null,
				barSpacingMm: barSpacingMm as number | null,
				barDirection,
				note
			}
		};
	};
}
