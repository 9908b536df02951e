import { QueryTypes, type Sequelize } from 'sequelize';
import type { GroupKey, ResearchFilter } from './filter';
import type { SelectedMember } from './members';
import type { ResearchMember } from './schemas';
import { SELECTION_JOINS, selectionWhere } from './selection';

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

/**
 * Covers of the whole selection and of each group within it (by the `groupBy` fields), read
 * with one query over the readings' (member, cover) covering index. Groups come back sorted by
 * their key so pages and CSV files list them in a stable order.
 */
export async function gatherGroups(
	sequelize: Sequelize,
	filter: ResearchFilter,
	members: ReadonlyMap<number, SelectedMember>,
	groupBy: readonly GroupKey[]
): Promise<{ all: GroupValues; groups: GroupValues[] }> {
	const where = selectionWhere(filter);
	const rows = await sequelize.query<{ memberId: number; coverMm: number }>(
		`SELECT r.member_id AS memberId, r.cover_mm AS coverMm
		   FROM readings r JOIN members m ON m.id = r.member_id ${SELECTION_JOINS}
		  WHERE ${where.sql}`,
		{ type: QueryTypes.SELECT, replacements: where.replacements }
	);
	const all = emptyGroup({});
	const byKey = new Map<string, GroupValues>();
	for (const row of rows) {
		const member = members.get(row.memberId)?.public;
		if (!member) continue;
		add(all, member, row.coverMm);
		const key = Object.fromEntries(groupBy.map((k) => [k, KEY_OF[k](member)]));
		const id = JSON.stringify(key);
		let group = byKey.get(id);
		if (!group) byKey.set(id, (group = emptyGroup(key)));
		add(group, member, row.coverMm);
	}
	const groups = [...byKey.entries()].sort(([a], [b]) => a.localeCompare(b)).map(([, g]) => g);
	return { all, groups };
}
