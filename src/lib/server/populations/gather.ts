/**
 * SQL that gathers a population's readings. Two queries: the members in scope (small), then
 * every cover of those members in one ordered query over the covering index
 * readings (member_id, cover_mm) — read from the index alone, already sorted within each member,
 * no filesort (STACK.md pitfall 4; EXPLAIN in tests/integration/populations.test.ts).
 * Covers come into Node and the engine computes there: per-group PERCENTILE_CONT in SQL was
 * 3–5× slower on a million readings.
 */
import type { WhereOptions } from 'sequelize';
import { db, Member } from '$lib/server/db';

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
	memberType?: string;
	exposureClass?: string;
	face?: string;
	memberId?: number;
}

/** The members in scope with their specified cover, ordered by id. */
export async function membersInScope(filter: MemberFilter): Promise<MemberSpec[]> {
	const where: WhereOptions = { assetId: filter.assetId };
	if (filter.surveyId) Object.assign(where, { surveyId: filter.surveyId });
	if (filter.memberType) Object.assign(where, { memberType: filter.memberType });
	if (filter.exposureClass) Object.assign(where, { exposureClass: filter.exposureClass });
	if (filter.face) Object.assign(where, { face: filter.face });
	if (filter.memberId) Object.assign(where, { id: filter.memberId });
	db();
	const rows = await Member.findAll({
		attributes: [...SPEC_ATTRIBUTES],
		where,
		order: [['id', 'ASC']],
		raw: true
	});
	return rows as MemberSpec[];
}

type RawConnection = {
	query(options: { sql: string; rowsAsArray: boolean }, values: unknown[]): Promise<unknown>;
};

/**
 * Every cover of the given members in one ordered query, handed to `sink` row by row as
 * (memberId, coverMm). Uses the connector directly with rowsAsArray: a million readings as
 * objects through Sequelize cost about twice as long.
 */
export async function forEachCover(
	memberIds: readonly number[],
	sink: (memberId: number, coverMm: number) => void
): Promise<void> {
	if (memberIds.length === 0) return;
	const manager = db().connectionManager;
	const connection = (await manager.getConnection({ type: 'read' })) as unknown as RawConnection;
	try {
		const rows = (await connection.query(
			{
				sql: 'SELECT member_id, cover_mm FROM readings WHERE member_id IN (?) ORDER BY member_id, cover_mm',
				rowsAsArray: true
			},
			[memberIds]
		)) as [number, number][];
		for (let i = 0; i < rows.length; i++) sink(rows[i][0], rows[i][1]);
	} finally {
		manager.releaseConnection(connection as never);
	}
}
