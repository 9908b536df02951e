import { z } from 'zod';
import { FIELD_LABELS, type ColumnMapping, type ImportOptions, type ReadingField } from './mapping';
import { MM_PER_INCH, parseDecimal } from './numbers';

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

const LENGTH_FIELDS = ['x', 'y', 'cover', 'diameter', 'spacing'] as const;

function readingSchema(coverMaxMm: number) {
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

/**
 * Turns one record of text cells into a reading, or says in plain words what is wrong with it.
 * Numbers are read with the file's decimal mark, converted to mm, then checked by zod.
 */
export function createRowValidator(
	mapping: ColumnMapping,
	options: ImportOptions,
	members: ReadonlyMap<string, number>
): (cells: readonly string[]) => RowResult {
	const schema = readingSchema(options.coverMaxMm);
	const factor = options.units === 'inch' ? MM_PER_INCH : 1;
	const widthNeeded = Math.max(...Object.values(mapping).map((c) => (c ?? -1) + 1));
	const cell = (cells: readonly string[], field: ReadingField) => {
		const index = mapping[field];
		return index == null ? '' : (cells[index] ?? '');
	};
	const readLength = (cells: readonly string[], field: (typeof LENGTH_FIELDS)[number]) => {
		const raw = cell(cells, field);
		const value = parseDecimal(raw, options.decimalMark);
		if (typeof value !== 'string') return value === null ? null : value * factor;
		const what =
			value === 'wrong-decimal-mark'
				? `uses the wrong decimal mark (this import reads '${options.decimalMark}')`
				: 'is not a number';
		return { code: `${field}.${value}`, reason: `${FIELD_LABELS[field]} "${raw}" ${what}` };
	};
	return (cells) => {
		if (cells.length < widthNeeded) {
			return {
				ok: false,
				code: 'width',
				reason: `the row has ${cells.length} field(s) but the mapping needs ${widthNeeded} (is the delimiter right?)`
			};
		}
		const coverMm = readLength(cells, 'cover');
		const xMm = readLength(cells, 'x');
		const yMm = readLength(cells, 'y');
		const barDiameterMm = readLength(cells, 'diameter');
		const barSpacingMm = readLength(cells, 'spacing');
		for (const v of [coverMm, xMm, yMm, barDiameterMm, barSpacingMm]) {
			if (v !== null && typeof v === 'object') return { ok: false, ...v };
		}
		const memberLabel =
			mapping.memberLabel == null
				? (options.fixedMemberLabel ?? '')
				: cell(cells, 'memberLabel').trim();
		const candidate = {
			memberLabel,
			coverMm,
			xMm,
			yMm,
			barDiameterMm,
			barSpacingMm,
			barDirection: cell(cells, 'direction').trim() || null,
			note: cell(cells, 'note').trim() || null
		};
		const parsed = schema.safeParse(candidate);
		if (!parsed.success) {
			const issue = parsed.error.issues[0];
			return { ok: false, code: `${String(issue.path[0])}.${issue.code}`, reason: issue.message };
		}
		const memberId = members.get(labelKey(memberLabel));
		if (memberId === undefined) {
			return {
				ok: false,
				code: 'member.unknown',
				reason: `member label "${memberLabel}" is not a member of this survey (add the member first, or check the label)`
			};
		}
		const r = parsed.data;
		return {
			ok: true,
			reading: {
				memberId,
				xMm: r.xMm,
				yMm: r.yMm,
				coverMm: r.coverMm,
				barDiameterMm: r.barDiameterMm,
				barSpacingMm: r.barSpacingMm,
				barDirection: r.barDirection,
				note: r.note
			}
		};
	};
}
