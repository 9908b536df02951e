import {
	carbonationTestSchema,
	chlorideProfileSchema,
	type CarbonationTestInput,
	type ChlorideProfileInput
} from '$lib/intake/measurements';
import type { DecimalMark } from '../numbers';
import { parseDecimal } from '../numbers';
import { labelKey } from '../validateRow';
import type { CarbonationMapping, ChlorideMapping } from './mapping';

/** A file row: its number in the file and its cells. */
export interface FileRow {
	rowNumber: number;
	cells: string[];
}
export type RowProblem = { rowNumber: number; reason: string; cells: string[] };

const cellOf = (cells: readonly string[], index: number | null) =>
	index == null ? '' : (cells[index] ?? '').trim();

/**
 * A date cell: ISO text, or the serial number a spreadsheet stores for a date (days since
 * 1899-12-30 in the 1900 date system, ECMA-376 Part 1 §18.17.4.1, which counts the
 * non-existent 29 February 1900 and so starts the count a day early).
 */
export function readDate(raw: string): string {
	if (/^\d{5}(?:\.0+)?$/.test(raw)) {
		const days = Number(raw);
		return new Date(Date.UTC(1899, 11, 30) + days * 86_400_000).toISOString().slice(0, 10);
	}
	return raw;
}

/** A number cell read with the file's decimal mark; text that is no number stays as it is, so
 * the schema names the field in its message. */
function readNumber(raw: string, mark: DecimalMark): number | string | null {
	const value = parseDecimal(raw, mark);
	return typeof value === 'string' ? raw : value;
}

/** The first problem zod found; the shared schemas' messages name their field. */
const firstIssue = (error: { issues: { message: string }[] }) => error.issues[0].message;

export interface MemberLookup {
	memberId(label: string): number | undefined;
	fixedLabel: string | null;
}

function memberOf(cells: string[], memberColumn: number | null, members: MemberLookup) {
	const label = memberColumn == null ? (members.fixedLabel ?? '') : cellOf(cells, memberColumn);
	return { label, id: members.memberId(labelKey(label)) };
}

/** Carbonation rows to tests, or the problems, each with its row number. */
export function carbonationRows(
	rows: FileRow[],
	mapping: CarbonationMapping,
	mark: DecimalMark,
	members: MemberLookup
) {
	const tests: { rowNumber: number; memberId: number; input: CarbonationTestInput }[] = [];
	const problems: RowProblem[] = [];
	const seen = new Map<string, number>();
	for (const { rowNumber, cells } of rows) {
		const fail = (reason: string) => problems.push({ rowNumber, reason, cells });
		const member = memberOf(cells, mapping.memberLabel, members);
		if (member.id === undefined) {
			fail(`member label "${member.label}" is not a member of this survey`);
			continue;
		}
		const get = (i: number | null) => cellOf(cells, i);
		const num = (i: number | null) => readNumber(get(i), mark);
		const depths = get(mapping.depths);
		const parsed = carbonationTestSchema.safeParse({
			label: get(mapping.label),
			xMm: num(mapping.x),
			yMm: num(mapping.y),
			testedOn: readDate(get(mapping.testedOn)),
			depthsMm: mark === ',' ? depths.replace(/,/g, '.') : depths,
			depthMinMm: num(mapping.depthMin),
			depthMeanMm: num(mapping.depthMean),
			depthMaxMm: num(mapping.depthMax),
			method: get(mapping.method) || null,
			notes: get(mapping.notes) || null
		});
		if (!parsed.success) {
			fail(firstIssue(parsed.error));
			continue;
		}
		const key = `${member.id}|${labelKey(parsed.data.label)}`;
		const earlier = seen.get(key);
		if (earlier !== undefined) {
			fail(`location "${parsed.data.label}" on ${member.label} is already on row ${earlier}`);
			continue;
		}
		seen.set(key, rowNumber);
		tests.push({ rowNumber, memberId: member.id, input: parsed.data });
	}
	return { tests, problems };
}

interface ProfileRows {
	memberId: number;
	memberLabel: string;
	rows: FileRow[];
}

/** Chloride rows grouped into profiles by member, profile label and test date. */
function groupProfiles(
	rows: FileRow[],
	mapping: ChlorideMapping,
	members: MemberLookup,
	problems: RowProblem[]
) {
	const profiles = new Map<string, ProfileRows>();
	for (const row of rows) {
		const member = memberOf(row.cells, mapping.memberLabel, members);
		if (member.id === undefined) {
			problems.push({
				...row,
				reason: `member label "${member.label}" is not a member of this survey`
			});
			continue;
		}
		const key = [
			member.id,
			labelKey(cellOf(row.cells, mapping.label)),
			readDate(cellOf(row.cells, mapping.testedOn))
		].join('|');
		const profile = profiles.get(key) ?? {
			memberId: member.id,
			memberLabel: member.label,
			rows: []
		};
		profile.rows.push(row);
		profiles.set(key, profile);
	}
	return [...profiles.values()];
}

/** Chloride rows to profiles with their increments (from the surface inwards), or the problems. */
export function chlorideRows(
	rows: FileRow[],
	mapping: ChlorideMapping,
	mark: DecimalMark,
	members: MemberLookup
) {
	const problems: RowProblem[] = [];
	const profiles: { rowNumbers: number[]; memberId: number; input: ChlorideProfileInput }[] = [];
	for (const profile of groupProfiles(rows, mapping, members, problems)) {
		const get = (cells: string[], i: number | null) => cellOf(cells, i);
		const num = (cells: string[], i: number | null) => readNumber(get(cells, i), mark);
		const increments = profile.rows.map((r) => ({
			row: r,
			fromMm: num(r.cells, mapping.fromMm),
			toMm: num(r.cells, mapping.toMm),
			chloridePercent: num(r.cells, mapping.chloridePercent)
		}));
		const bad = increments.find((i) =>
			[i.fromMm, i.toMm, i.chloridePercent].some((v) => typeof v !== 'number')
		);
		if (bad) {
			problems.push({
				...bad.row,
				reason: 'from (mm), to (mm) and chloride (%) must each be a number'
			});
			continue;
		}
		const sorted = increments.sort((a, b) => (a.fromMm as number) - (b.fromMm as number));
		const first = sorted[0].row.cells;
		const basis = get(first, mapping.basis).toLowerCase();
		const otherBasis = sorted.find((i) => get(i.row.cells, mapping.basis).toLowerCase() !== basis);
		if (otherBasis) {
			problems.push({
				...otherBasis.row,
				reason: `basis "${get(otherBasis.row.cells, mapping.basis)}" differs from the profile's first row ("${basis}"): one profile has one basis`
			});
			continue;
		}
		const parsed = chlorideProfileSchema.safeParse({
			label: get(first, mapping.label),
			xMm: num(first, mapping.x),
			yMm: num(first, mapping.y),
			testedOn: readDate(get(first, mapping.testedOn)),
			method: get(first, mapping.method) || null,
			notes: get(first, mapping.notes) || null,
			basis,
			binderContentKgM3: num(first, mapping.binderContent),
			concreteDensityKgM3: num(first, mapping.concreteDensity),
			initialContentPercent: num(first, mapping.initialContent),
			increments: sorted.map(({ fromMm, toMm, chloridePercent }) => ({
				fromMm,
				toMm,
				chloridePercent
			}))
		});
		if (!parsed.success) {
			const message = firstIssue(parsed.error);
			// "Increment 3 (…)" names the increment from the surface: the row that holds it.
			const n = /^Increment (\d+)/.exec(message);
			const at = sorted[n ? Number(n[1]) - 1 : 0]?.row ?? sorted[0].row;
			const name = `profile "${get(first, mapping.label)}" on ${profile.memberLabel}`;
			problems.push({ ...at, reason: `${name}: ${message}` });
			continue;
		}
		profiles.push({
			rowNumbers: sorted.map((i) => i.row.rowNumber),
			memberId: profile.memberId,
			input: parsed.data
		});
	}
	return { profiles, problems };
}
