import { countedFromTally, gridValue, type CountedSample, type CoverGrid } from '$lib/analysis';
import { readCoverCounts } from '../readings/coverSets';
import type { GroupKey } from './filter';
import type { SelectedMember } from './members';
import type { ResearchMember } from './schemas';

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
	memberRefs: Set<string>;
	assetRefs: Set<string>;
}

const KEY_OF: Record<GroupKey, (m: ResearchMember) => string | number | null> = {
	memberType: (m) => m.memberType,
	exposureClass: (m) => m.exposureClass,
	face: (m) => m.face,
	designCode: (m) => m.designCode,
	decade: (m) => m.constructionDecade,
	cNomMm: (m) => m.cNomMm
};

function emptyGroup(key: GroupValues['key']): GroupValues {
	return {
		key,
		readingCount: 0,
		coversMm: new Tally(),
		deviationsMm: new Tally(),
		marginsMm: new Tally(),
		memberRefs: new Set(),
		assetRefs: new Set()
	};
}

/** A member's counts into the group: each value as each reading would give it (the same doubles). */
function add(group: GroupValues, member: ResearchMember, counts: CountedSample): void {
	group.coversMm.add(counts, 0);
	group.deviationsMm.add(counts, member.cNomMm);
	group.marginsMm.add(counts, member.cMinMm);
	group.readingCount += counts.n;
	group.memberRefs.add(member.memberRef);
	group.assetRefs.add(member.assetRef);
}

/** Members whose cover counts are read at once: bounds memory however big the selection is. */
const MEMBERS_PER_READ = 200;

/** The selection's members with their cover counts, a few hundred members at a time. */
async function* membersWithCovers(
	members: ReadonlyMap<number, SelectedMember>
): AsyncGenerator<[SelectedMember, CountedSample]> {
	const ids = [...members.keys()];
	for (let i = 0; i < ids.length; i += MEMBERS_PER_READ) {
		const part = ids.slice(i, i + MEMBERS_PER_READ);
		const covers = await readCoverCounts(part);
		for (const id of part) {
			const memberCovers = covers.get(id);
			if (memberCovers) yield [members.get(id)!, memberCovers];
		}
	}
}

/**
 * Cover counts of the whole selection and of each group within it (by the `groupBy` fields),
 * member by member. Groups come back sorted by their key, for a stable order.
 */
export async function gatherGroups(
	members: ReadonlyMap<number, SelectedMember>,
	groupBy: readonly GroupKey[]
): Promise<{ all: GroupValues; groups: GroupValues[] }> {
	const all = emptyGroup({});
	const byKey = new Map<string, GroupValues>();
	for await (const [{ public: member }, covers] of membersWithCovers(members)) {
		const key = Object.fromEntries(groupBy.map((k) => [k, KEY_OF[k](member)]));
		const name = JSON.stringify(key);
		let group = byKey.get(name);
		if (!group) byKey.set(name, (group = emptyGroup(key)));
		add(all, member, covers);
		add(group, member, covers);
	}
	const groups = [...byKey.entries()]
		.filter(([, g]) => g.readingCount > 0)
		.sort(([a], [b]) => a.localeCompare(b))
		.map(([, g]) => g);
	return { all, groups };
}
