import { QueryTypes, type Sequelize } from 'sequelize';
import { countedFromTally, gridValue, type CountedSample, type CoverGrid } from '$lib/analysis';
import { gridCountsBuffer, readGridCounts } from '../readings/coverCountCodec';
import { readCoverCounts } from '../readings/coverSets';
import type { GroupKey, ResearchFilter } from './filter';
import { constructionDecade } from './pseudonym';
import { SELECTION_JOINS, selectionWhere } from './selection';

/** Widest run of grid steps one tally holds as an array (beyond: a map of values). */
const MAX_STEP_RANGE = 1_000_000;

/**
 * Readings at each distinct value of (cover − shift), mm: a population as counts
 * (analysis/countedSample.ts). Members on a meter grid add into an array indexed by grid step,
 * one per grid and shift (c_nom, c_min), so gathering costs array additions rather than hashing
 * doubles; each value is formed once at the end by the same subtraction a reading would get.
 */
export class Tally {
	private readonly onGrid = new Map<
		string,
		{ grid: CoverGrid; shift: number; offset: number; counts: Float64Array }
	>();
	private readonly offGrid = new Map<number, number>();

	add(sample: CountedSample, shift: number): void {
		const { values, counts, lattice } = sample;
		const steps = lattice?.steps;
		const lo = steps?.[0] ?? 0;
		const hi = steps?.[steps.length - 1] ?? 0;
		if (!lattice || !steps || lattice.a !== 0 || lattice.b !== 1 || hi - lo > MAX_STEP_RANGE) {
			for (let i = 0; i < values.length; i++) {
				const v = values[i] - shift;
				this.offGrid.set(v, (this.offGrid.get(v) ?? 0) + counts[i]);
			}
			return;
		}
		const key = `${lattice.grid.den}:${lattice.grid.factor}:${shift}`;
		let entry = this.onGrid.get(key);
		if (!entry) {
			entry = { grid: lattice.grid, shift, offset: lo, counts: new Float64Array(hi - lo + 1) };
			this.onGrid.set(key, entry);
		}
		const end = entry.offset + entry.counts.length - 1;
		if (lo < entry.offset || hi > end) {
			const from = Math.min(lo, entry.offset);
			const grown = new Float64Array(Math.max(hi, end) - from + 1);
			grown.set(entry.counts, entry.offset - from);
			entry.counts = grown;
			entry.offset = from;
		}
		for (let i = 0; i < steps.length; i++) entry.counts[steps[i] - entry.offset] += counts[i];
	}

	/** Another tally's counts added in (a group's into the selection's). Cost O(its entries). */
	addTally(other: Tally): void {
		for (const [v, c] of other.offGrid) this.offGrid.set(v, (this.offGrid.get(v) ?? 0) + c);
		for (const [key, part] of other.onGrid) {
			const entry = this.onGrid.get(key);
			if (!entry) this.onGrid.set(key, { ...part, counts: part.counts.slice() });
			else {
				const from = Math.min(entry.offset, part.offset);
				const to = Math.max(entry.offset + entry.counts.length, part.offset + part.counts.length);
				const grown = new Float64Array(to - from);
				grown.set(entry.counts, entry.offset - from);
				for (let j = 0; j < part.counts.length; j++)
					grown[j + part.offset - from] += part.counts[j];
				entry.counts = grown;
				entry.offset = from;
			}
		}
	}

	/** The tally as a counted sample. Cost O(distinct values). */
	toCounted(): CountedSample {
		const tally = new Map(this.offGrid);
		for (const { grid, shift, offset, counts } of this.onGrid.values()) {
			for (let j = 0; j < counts.length; j++) {
				if (counts[j] === 0) continue;
				const v = gridValue(j + offset, grid) - shift;
				tally.set(v, (tally.get(v) ?? 0) + counts[j]);
			}
		}
		return countedFromTally(tally);
	}
}

/**
 * The values of one population of the selection, gathered for the engine as counts: memory
 * and time follow the number of distinct values, not of readings.
 */
export interface GroupValues {
	key: Partial<Record<GroupKey, string | number | null>>;
	readingCount: number;
	coversMm: Tally;
	/** Measured − c_nom of each reading, in mm. */
	deviationsMm: Tally;
	/** Measured − c_min of each reading, in mm (below 0: under the minimum). */
	marginsMm: Tally;
	/** Database ids, only counted: a statistic names no member or asset, so none is pseudonymised. */
	memberIds: Set<number>;
	assetIds: Set<number>;
}

/** A selected member's grouping fields and its stored counts (null: not written, or no readings). */
interface CountRow {
	id: number;
	assetId: number;
	memberType: string;
	face: string;
	exposureClass: string;
	designCode: string;
	yearOfConstruction: number | null;
	cMinMm: number;
	cNomMm: number;
	den: number | null;
	factor: number | null;
	counts: Buffer | null;
}

const KEY_OF: Record<GroupKey, (m: CountRow) => string | number | null> = {
	memberType: (m) => m.memberType,
	exposureClass: (m) => m.exposureClass,
	face: (m) => m.face,
	designCode: (m) => m.designCode,
	decade: (m) => constructionDecade(m.yearOfConstruction),
	cNomMm: (m) => m.cNomMm
};

/**
 * Readings at each grid step of the members of one group that share a grid, c_nom and c_min:
 * the members' stored counts add here straight from their bytes, so a member costs one pass
 * over its distinct covers (no decoded arrays, no pseudonym); the three populations (cover,
 * deviation, margin) are formed once a group is complete.
 */
interface StepCounts {
	grid: CoverGrid;
	cNomMm: number;
	cMinMm: number;
	offset: number;
	counts: Float64Array;
}

interface Gathering {
	values: GroupValues;
	steps: Map<string, StepCounts>;
}

function emptyGroup(key: GroupValues['key']): GroupValues {
	return {
		key,
		readingCount: 0,
		coversMm: new Tally(),
		deviationsMm: new Tally(),
		marginsMm: new Tally(),
		memberIds: new Set(),
		assetIds: new Set()
	};
}

/** Decoded grid counts of the row being added; one per process, grown as rows need. */
const decoded = gridCountsBuffer();

/** A member's counts as stored on its grid (coverCountCodec.ts) added in; returns its readings. */
function addOnGrid(gathering: Gathering, row: CountRow, grid: CoverGrid, bytes: Buffer): number {
	const entries = readGridCounts(bytes, decoded);
	if (entries === 0) return 0;
	const { steps, counts } = decoded;
	const lo = steps[0];
	const hi = steps[entries - 1];
	const name = `${grid.den}:${grid.factor}:${row.cNomMm}:${row.cMinMm}`;
	let at = gathering.steps.get(name);
	if (!at) {
		at = { grid, cNomMm: row.cNomMm, cMinMm: row.cMinMm, offset: lo, counts: new Float64Array(0) };
		gathering.steps.set(name, at);
	}
	const end = at.offset + at.counts.length - 1;
	if (at.counts.length === 0 || lo < at.offset || hi > end) {
		const from = at.counts.length === 0 ? lo : Math.min(lo, at.offset);
		const to = at.counts.length === 0 ? hi : Math.max(hi, end);
		const grown = new Float64Array(to - from + 1);
		grown.set(at.counts, at.offset - from);
		at.counts = grown;
		at.offset = from;
	}
	const into = at.counts;
	const offset = at.offset;
	let n = 0;
	for (let i = 0; i < entries; i++) {
		into[steps[i] - offset] += counts[i];
		n += counts[i];
	}
	return n;
}

/** One member's counts into its group: each value as each reading would give it (the same doubles). */
function addMember(gathering: Gathering, row: CountRow, sample: CountedSample | null): void {
	const group = gathering.values;
	let n: number;
	if (sample) {
		group.coversMm.add(sample, 0);
		group.deviationsMm.add(sample, row.cNomMm);
		group.marginsMm.add(sample, row.cMinMm);
		n = sample.n;
	} else {
		const grid = { den: Number(row.den), factor: Number(row.factor) };
		n = addOnGrid(gathering, row, grid, row.counts!);
	}
	if (n === 0) return;
	group.readingCount += n;
	group.memberIds.add(row.id);
	group.assetIds.add(row.assetId);
}

/** The step counts of a complete group into its three populations. Cost O(steps spanned). */
function settle({ values, steps }: Gathering): GroupValues {
	for (const { grid, cNomMm, cMinMm, offset, counts } of steps.values()) {
		const kept: number[] = [];
		for (let j = 0; j < counts.length; j++) if (counts[j] > 0) kept.push(j);
		if (kept.length === 0) continue;
		const sample: CountedSample = {
			values: Float64Array.from(kept, (j) => gridValue(j + offset, grid)),
			counts: Float64Array.from(kept, (j) => counts[j]),
			n: 0,
			lattice: { grid, steps: Float64Array.from(kept, (j) => j + offset), a: 0, b: 1 }
		};
		values.coversMm.add(sample, 0);
		values.deviationsMm.add(sample, cNomMm);
		values.marginsMm.add(sample, cMinMm);
	}
	steps.clear();
	return values;
}

/** Members read at once: bounds memory (a few MB of counts) however big the selection is. */
const MEMBERS_PER_PAGE = 1000;

/** Only grouping fields and counts are read: names, labels, locations and notes stay in the database. */
const COUNT_COLUMNS = `m.id, m.asset_id AS assetId, m.member_type AS memberType, m.face,
	m.exposure_class AS exposureClass, a.design_code AS designCode,
	a.year_of_construction AS yearOfConstruction, m.c_min_mm AS cMinMm, m.c_nom_mm AS cNomMm,
	c.grid_den AS den, c.grid_factor AS factor, c.cover_counts AS counts`;

/** The selection's members with their stored counts, a page at a time in id order (one indexed query a page). */
async function* selectionCountRows(
	sequelize: Sequelize,
	filter: ResearchFilter
): AsyncGenerator<CountRow[]> {
	const where = selectionWhere(filter);
	let after = 0;
	for (;;) {
		// STRAIGHT_JOIN: walk members by primary key from `after` and stop at the page's end.
		// Left to itself the optimiser starts from surveys' status index and sorts every
		// selected member, counts included, into a temporary table for each page (measured: 33 s
		// for 30 pages of 1,000 members, against 2–8 s in key order).
		const rows = await sequelize.query<CountRow>(
			`SELECT STRAIGHT_JOIN ${COUNT_COLUMNS} FROM members m ${SELECTION_JOINS}
			   LEFT JOIN member_cover_sets c ON c.member_id = m.id
			  WHERE ${where.sql} AND m.id > :after ORDER BY m.id LIMIT ${MEMBERS_PER_PAGE}`,
			{ type: QueryTypes.SELECT, replacements: { ...where.replacements, after } }
		);
		if (rows.length === 0) return;
		yield rows;
		after = rows[rows.length - 1].id;
	}
}

/**
 * Cover counts of the whole selection and of each group within it (by the `groupBy` fields),
 * member by member. Groups come back sorted by their key, for a stable order.
 */
export async function gatherGroups(
	sequelize: Sequelize,
	filter: ResearchFilter,
	groupBy: readonly GroupKey[]
): Promise<{ all: GroupValues; groups: GroupValues[] }> {
	const byKey = new Map<string, Gathering>();
	const gatheringOf = (row: CountRow) => {
		const key = Object.fromEntries(groupBy.map((k) => [k, KEY_OF[k](row)]));
		const name = JSON.stringify(key);
		let gathering = byKey.get(name);
		if (!gathering) byKey.set(name, (gathering = { values: emptyGroup(key), steps: new Map() }));
		return gathering;
	};
	for await (const page of selectionCountRows(sequelize, filter)) {
		// Members whose counts were never written (stored before counts were kept) or are off
		// every grid: the one reader that decodes them, or counts them from the readings.
		const other = page.filter((r) => r.counts === null || r.den === null || r.factor === null);
		const decoded = other.length > 0 ? await readCoverCounts(other.map((r) => r.id)) : null;
		for (const row of page) {
			const fromReader = row.counts === null || row.den === null || row.factor === null;
			if (fromReader) {
				const sample = decoded?.get(row.id);
				if (sample) addMember(gatheringOf(row), row, sample);
			} else addMember(gatheringOf(row), row, null);
		}
	}
	const groups = [...byKey.entries()]
		.filter(([, g]) => g.values.readingCount > 0)
		.sort(([a], [b]) => a.localeCompare(b))
		.map(([, g]) => g);
	// The whole selection: every group's step counts and off-grid tallies again, before settling.
	const all = emptyGroup({});
	const allSteps: Gathering = { values: all, steps: new Map() };
	for (const { values, steps } of groups) {
		all.readingCount += values.readingCount;
		for (const id of values.memberIds) all.memberIds.add(id);
		for (const id of values.assetIds) all.assetIds.add(id);
		for (const [name, part] of steps) {
			const at = allSteps.steps.get(name);
			if (!at) allSteps.steps.set(name, { ...part, counts: part.counts.slice() });
			else mergeSteps(at, part);
		}
		all.coversMm.addTally(values.coversMm);
		all.deviationsMm.addTally(values.deviationsMm);
		all.marginsMm.addTally(values.marginsMm);
	}
	return { all: settle(allSteps), groups: groups.map(settle) };
}

/** Step counts of the same grid, c_nom and c_min added together. */
function mergeSteps(into: StepCounts, part: StepCounts): void {
	const from = Math.min(into.offset, part.offset);
	const to = Math.max(into.offset + into.counts.length, part.offset + part.counts.length);
	if (from !== into.offset || to !== into.offset + into.counts.length) {
		const grown = new Float64Array(to - from);
		grown.set(into.counts, into.offset - from);
		into.counts = grown;
		into.offset = from;
	}
	for (let j = 0; j < part.counts.length; j++)
		into.counts[j + part.offset - into.offset] += part.counts[j];
}
