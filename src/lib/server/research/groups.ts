import { QueryTypes, type Sequelize } from 'sequelize';
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

/** Covers per query: bounds the objects the connector makes at once, however big a member is. */
const COVERS_PER_QUERY = 20_000;

/**
 * One member's covers, a page at a time in index order (keyset on cover, id over the readings'
 * (member, cover) covering index), so no page sorts and memory holds one page of rows.
 */
async function* memberCovers(sequelize: Sequelize, memberId: number): AsyncGenerator<number[]> {
	let after = { coverMm: -Infinity, id: 0 };
	for (;;) {
		const rows = await sequelize.query<{ id: number; coverMm: number }>(
			`SELECT id, cover_mm AS coverMm FROM readings
			  WHERE member_id = :memberId AND (cover_mm > :cover OR (cover_mm = :cover AND id > :id))
			  ORDER BY cover_mm, id LIMIT :limit`,
			{
				type: QueryTypes.SELECT,
				replacements: {
					memberId,
					cover: Number.isFinite(after.coverMm) ? after.coverMm : -1e308,
					id: after.id,
					limit: COVERS_PER_QUERY
				}
			}
		);
		if (rows.length === 0) return;
		yield rows.map((r) => r.coverMm);
		after = rows[rows.length - 1];
		if (rows.length < COVERS_PER_QUERY) return;
	}
}

/**
 * Covers of the whole selection and of each group within it (by the `groupBy` fields), member
 * by member. Groups come back sorted by their key, for a stable order.
 */
export async function gatherGroups(
	sequelize: Sequelize,
	members: ReadonlyMap<number, SelectedMember>,
	groupBy: readonly GroupKey[]
): Promise<{ all: GroupValues; groups: GroupValues[] }> {
	const all = emptyGroup({});
	const byKey = new Map<string, GroupValues>();
	for (const { id, public: member } of members.values()) {
		const key = Object.fromEntries(groupBy.map((k) => [k, KEY_OF[k](member)]));
		const name = JSON.stringify(key);
		let group = byKey.get(name);
		if (!group) byKey.set(name, (group = emptyGroup(key)));
		for await (const covers of memberCovers(sequelize, id)) {
			for (const coverMm of covers) {
				add(all, member, coverMm);
				add(group, member, coverMm);
			}
		}
	}
	const groups = [...byKey.entries()]
		.filter(([, g]) => g.coversMm.length > 0)
		.sort(([a], [b]) => a.localeCompare(b))
		.map(([, g]) => g);
	return { all, groups };
}
