/**
 * SQL that gathers a population's readings. Two queries: the members in scope (small), then
 * their cover counts (src/lib/server/readings/coverSets.ts, readCoverCounts), one short row a
 * member: each distinct cover on the meter's grid once with its number of readings. The engine
 * computes from the counts in Node, so the cost is members × distinct covers, never readings
 * (docs/performance.md, "Pages").
 */
import type { WhereOptions } from 'sequelize';
import { db, Member } from '$lib/server/db';
import type { CountedSample } from '$lib/analysis';
import { readCoverCounts } from '$lib/server/readings/coverSets';

export type MemberSpec = Pick<
	Member,
	| 'id'
	| 'surveyId'
	| 'label'
	| 'memberType'
	| 'face'
	| 'exposureClass'
	| 'requirementSource'
	| 'cMinMm'
	| 'cNomMm'
	| 'deltaCDevMm'
	| 'deltaPlusMm'
	| 'memberDepthMm'
>;

const SPEC_ATTRIBUTES = [
	'id',
	'surveyId',
	'label',
	'memberType',
	'face',
	'exposureClass',
	'requirementSource',
	'cMinMm',
	'cNomMm',
	'deltaCDevMm',
	'deltaPlusMm',
	'memberDepthMm'
] as const;

export interface MemberFilter {
	assetId: number;
	surveyId?: number;
	/** Only members of these surveys (an empty list matches none). */
	surveyIds?: readonly number[];
	memberType?: string;
	exposureClass?: string;
	face?: string;
	memberId?: number;
	/** Only these members (a custom population); an empty list matches none. */
	memberIds?: readonly number[];
}

/** The members in scope with their specified cover, ordered by id. */
export async function membersInScope(filter: MemberFilter): Promise<MemberSpec[]> {
	const where: WhereOptions = { assetId: filter.assetId };
	if (filter.surveyId) Object.assign(where, { surveyId: filter.surveyId });
	if (filter.surveyIds) {
		if (filter.surveyIds.length === 0) return [];
		Object.assign(where, { surveyId: [...filter.surveyIds] });
	}
	if (filter.memberType) Object.assign(where, { memberType: filter.memberType });
	if (filter.exposureClass) Object.assign(where, { exposureClass: filter.exposureClass });
	if (filter.face) Object.assign(where, { face: filter.face });
	if (filter.memberId) Object.assign(where, { id: filter.memberId });
	if (filter.memberIds) {
		if (filter.memberIds.length === 0) return [];
		Object.assign(where, { id: [...filter.memberIds] });
	}
	db();
	const rows = await Member.findAll({
		attributes: [...SPEC_ATTRIBUTES],
		where,
		order: [['id', 'ASC']],
		raw: true
	});
	return rows as MemberSpec[];
}

/**
 * Each member's covers as counts of distinct values, by member id (members with no readings
 * are absent): one row a member however many readings it has.
 */
export async function countsOfMembers(
	memberIds: readonly number[]
): Promise<Map<number, CountedSample>> {
	return readCoverCounts(memberIds);
}
