/**
 * Members grouped into populations, and each population's cover counts merged from its
 * members' (O(groups × distinct values), never a pass over the readings).
 */
import { type CountedSample, mergeCounted } from '$lib/analysis';
import { countsOfMembers, membersInScope, type MemberFilter, type MemberSpec } from './gather';
import type { Split } from './query';

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
	/** Every cover of the group as counts of distinct values, merged (the engine's input). */
	sample: CountedSample;
	/**
	 * Each member's own counts, by member id (members with no readings are absent). Per-member
	 * figures come from these, never from the merged counts, which no longer say which member
	 * a cover belongs to.
	 */
	samplesByMember: Map<number, CountedSample>;
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
 * Gather the populations of a scope: the members, then every member's cover counts (one
 * short row a member). Cost: O(members × distinct covers) to read and merge.
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
	const byMember = await countsOfMembers(members.map((m) => m.id));
	return grouped.map(([id, g]) => {
		const own = g.members.flatMap((m) => {
			const sample = byMember.get(m.id);
			return sample ? [[m.id, sample] as const] : [];
		});
		return {
			id,
			key: g.key,
			members: g.members,
			sample: mergeCounted(own.map(([, sample]) => sample)),
			samplesByMember: new Map(own),
			countsByMember: new Map(g.members.map((m) => [m.id, byMember.get(m.id)?.n ?? 0]))
		};
	});
}
