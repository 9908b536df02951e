import { readCoverSets } from '../readings/coverSets';
import type { GroupKey } from './filter';
import type { SelectedMember } from './members';
import type { ResearchMember } from './schemas';

/** The values of one population of the selection, gathered for the engine. */
export interface GroupValues {
	key: Partial<Record<GroupKey, string | number | null>>;
	coversMm: number[];
	/** Measured − c_nom of each reading, in mm. */
	deviationsMm: number[];
	/** Measured − c_min of each reading, in mm (below 0: under the minimum). */
	marginsMm: number[];
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
		coversMm: [],
		deviationsMm: [],
		marginsMm: [],
		memberRefs: new Set(),
		assetRefs: new Set()
	};
}

function add(group: GroupValues, member: ResearchMember, coverMm: number): void {
	group.coversMm.push(coverMm);
	group.deviationsMm.push(coverMm - member.cNomMm);
	group.marginsMm.push(coverMm - member.cMinMm);
	group.memberRefs.add(member.memberRef);
	group.assetRefs.add(member.assetRef);
}

/** Members whose cover sets are read at once: bounds memory however big the selection is. */
const MEMBERS_PER_READ = 200;

/** The selection's members with their covers, a few hundred members at a time. */
async function* membersWithCovers(
	members: ReadonlyMap<number, SelectedMember>
): AsyncGenerator<[SelectedMember, Float64Array]> {
	const ids = [...members.keys()];
	for (let i = 0; i < ids.length; i += MEMBERS_PER_READ) {
		const part = ids.slice(i, i + MEMBERS_PER_READ);
		const covers = await readCoverSets(part);
		for (const id of part) {
			const memberCovers = covers.get(id);
			if (memberCovers) yield [members.get(id)!, memberCovers];
		}
	}
}

/**
 * Covers of the whole selection and of each group within it (by the `groupBy` fields), member
 * by member. Groups come back sorted by their key, for a stable order.
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
		for (const coverMm of covers) {
			add(all, member, coverMm);
			add(group, member, coverMm);
		}
	}
	const groups = [...byKey.entries()]
		.filter(([, g]) => g.coversMm.length > 0)
		.sort(([a], [b]) => a.localeCompare(b))
		.map(([, g]) => g);
	return { all, groups };
}
