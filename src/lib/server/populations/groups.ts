/**
 * Members grouped into populations, and each population's covers gathered into one
 * Float64Array, ascending.
 */
import { coversByMember, membersInScope, type MemberFilter, type MemberSpec } from './gather';
import type { Split } from './query';
import { mergeSorted } from '$lib/server/readings/coverSetCodec';

export interface PopulationKey {
	memberType: string;
	exposureClass: string;
	face?: string;
	surveyId?: number;
	memberId?: number;
	/** A population the engineer made (custom.ts), and whether this is what is left of its source. */
	customId?: number;
	rest?: boolean;
}

export interface GatheredGroup {
	key: PopulationKey;
	/** Stable text key, e.g. "deck|XD3" or "deck|XD3|member:12". */
	id: string;
	members: MemberSpec[];
	/** Every cover of the group, merged into one ascending array (the engine's input). */
	coversMm: Float64Array;
	/**
	 * Each member's own covers, ascending, by member id (members with no readings are absent).
	 * Per-member figures come from these, never from slices of the merged array, whose order
	 * no longer says which member a cover belongs to.
	 */
	coversByMember: Map<number, Float64Array>;
	/** Readings per member id, in member order. */
	countsByMember: Map<number, number>;
}

function keyOf(member: MemberSpec, split: Split): PopulationKey {
	const key: PopulationKey = { memberType: member.memberType, exposureClass: member.exposureClass };
	if (split === 'face') key.face = member.face;
	if (split === 'survey') key.surveyId = member.surveyId;
	if (split === 'member') key.memberId = member.id;
	return key;
}

export function keyId(key: PopulationKey): string {
	const parts = [key.memberType, key.exposureClass];
	if (key.face) parts.push(`face:${key.face}`);
	if (key.surveyId) parts.push(`survey:${key.surveyId}`);
	if (key.memberId) parts.push(`member:${key.memberId}`);
	if (key.customId) parts.push(`custom:${key.customId}${key.rest ? ':rest' : ''}`);
	return parts.join('|');
}

/** Group the members in scope by member type × exposure class (and the split), ordered by key. */
function groupMembers(members: MemberSpec[], split: Split) {
	const groups = new Map<string, { key: PopulationKey; members: MemberSpec[] }>();
	for (const member of members) {
		const key = keyOf(member, split);
		const id = keyId(key);
		const group = groups.get(id) ?? { key, members: [] };
		group.members.push(member);
		groups.set(id, group);
	}
	return [...groups.entries()].sort(([a], [b]) => a.localeCompare(b));
}

/**
 * One ascending array of the members' covers (each member's cover set is stored sorted), merged
 * pairwise: O(n log k) for k members, and the engine then needs no sort of its own.
 */
function joinCovers(parts: (Float64Array | undefined)[]): Float64Array {
	let runs = parts.filter((p): p is Float64Array => p !== undefined);
	if (runs.length === 0) return new Float64Array(0);
	while (runs.length > 1) {
		const merged: Float64Array[] = [];
		for (let i = 0; i < runs.length; i += 2)
			merged.push(i + 1 < runs.length ? mergeSorted(runs[i], runs[i + 1]) : runs[i]);
		runs = merged;
	}
	return runs[0];
}

/**
 * Gather the populations of a scope: the members, then every cover in one query.
 * Cost: one index range scan of the readings in scope, O(n) parsing and copying.
 */
export async function gatherGroups(filter: MemberFilter, split: Split): Promise<GatheredGroup[]> {
	const members = await membersInScope(filter);
	return gatherOf(members, groupMembers(members, split));
}

/**
 * Every member in scope as one population under the given key (a custom population, whatever
 * the members' types); null when no member matches.
 */
export async function gatherAsOne(
	filter: MemberFilter,
	key: (members: MemberSpec[]) => PopulationKey
): Promise<GatheredGroup | null> {
	const members = await membersInScope(filter);
	if (members.length === 0) return null;
	const k = key(members);
	const [group] = await gatherOf(members, [[keyId(k), { key: k, members }]]);
	return group;
}

async function gatherOf(
	members: MemberSpec[],
	grouped: [string, { key: PopulationKey; members: MemberSpec[] }][]
): Promise<GatheredGroup[]> {
	const byMember = await coversByMember(members.map((m) => m.id));
	const covers = grouped.map(([, g]) => joinCovers(g.members.map((m) => byMember.get(m.id))));
	return grouped.map(([id, g], index) => ({
		id,
		key: g.key,
		members: g.members,
		coversMm: covers[index],
		coversByMember: new Map(
			g.members.flatMap((m) => {
				const own = byMember.get(m.id);
				return own ? [[m.id, own] as const] : [];
			})
		),
		countsByMember: new Map(g.members.map((m) => [m.id, byMember.get(m.id)?.length ?? 0]))
	}));
}
