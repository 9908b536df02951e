import type { CountedSample } from '$lib/analysis';
import { readCoverCounts } from '../readings/coverSets';
import type { GroupKey } from './filter';
import type { SelectedMember } from './members';
import type { ResearchMember } from './schemas';

/** Readings at each distinct value (mm): a population as counts (analysis/countedSample.ts). */
export type Tally = Map<number, number>;

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
		coversMm: new Map(),
		deviationsMm: new Map(),
		marginsMm: new Map(),
		memberRefs: new Set(),
		assetRefs: new Set()
	};
}

const tally = (into: Tally, value: number, count: number) =>
	into.set(value, (into.get(value) ?? 0) + count);

/** A member's counts into the group: each value as each reading would give it (the same doubles). */
function add(group: GroupValues, member: ResearchMember, counts: CountedSample): void {
	const { values, counts: times } = counts;
	for (let i = 0; i < values.length; i++) {
		tally(group.coversMm, values[i], times[i]);
		tally(group.deviationsMm, values[i] - member.cNomMm, times[i]);
		tally(group.marginsMm, values[i] - member.cMinMm, times[i]);
	}
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
