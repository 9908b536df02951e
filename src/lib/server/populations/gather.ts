/**
 * SQL that gathers a population's readings. Two queries: the members in scope (small), then
 * every cover of those members in one query over the covering index readings (member_id,
 * cover_mm) — read from the index alone (STACK.md pitfall 4).
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
	query(
		options: string | { sql: string; rowsAsArray: boolean },
		values?: unknown[]
	): Promise<unknown>;
};

/**
 * One row a member, its covers as one comma-separated text. A row a reading cost ~4× as much:
 * each of a million rows went through the connector's per-field parsing (Sequelize installs a
 * typeCast callback on its connections), while the engine sorts the covers anyway.
 * Served by the covering index readings (member_id, cover_mm): an index-only range scan grouped
 * on the index prefix, no temporary table (EXPLAIN in tests/integration/populations.test.ts).
 */
export const COVERS_BY_MEMBER_SQL =
	"SELECT member_id, GROUP_CONCAT(cover_mm SEPARATOR ',') FROM readings WHERE member_id IN (?) GROUP BY member_id";

/** Room for a member's covers in one text: 1 GiB, far above any member's readings. */
const GROUP_CONCAT_LIMIT = 1 << 30;

/**
 * Every cover of the given members, by member id (members with no readings are absent).
 * MariaDB prints a DOUBLE with up to 15 significant digits, so a cover read from a file with
 * up to 15 digits comes back as the same number.
 */
export async function coversByMember(
	memberIds: readonly number[]
): Promise<Map<number, Float64Array>> {
	const covers = new Map<number, Float64Array>();
	if (memberIds.length === 0) return covers;
	const manager = db().connectionManager;
	const connection = (await manager.getConnection({ type: 'read' })) as unknown as RawConnection;
	try {
		await connection.query(`SET SESSION group_concat_max_len = ${GROUP_CONCAT_LIMIT}`);
		const rows = (await connection.query({ sql: COVERS_BY_MEMBER_SQL, rowsAsArray: true }, [
			memberIds
		])) as [number, string][];
		for (const [memberId, text] of rows) covers.set(memberId, parseCovers(text));
	} finally {
		manager.releaseConnection(connection as never);
	}
	return covers;
}

function parseCovers(text: string): Float64Array {
	const parts = text.split(',');
	const values = new Float64Array(parts.length);
	for (let i = 0; i < parts.length; i++) values[i] = Number(parts[i]);
	return values;
}
