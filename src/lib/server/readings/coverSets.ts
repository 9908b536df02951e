/**
 * Member cover sets: each member's covers kept beside its readings, sorted, in one row
 * (member_cover_sets, migration 009), and in the same row as counts of each distinct cover on
 * the meter's grid (migration 012, coverCountCodec.ts), which population statistics read. Every write of readings updates them in the same
 * transaction (import: merge; undo: rebuild), so the population overview reads one short row a
 * member instead of a million readings (docs/performance.md, "Pages").
 * The invariant: a member with readings has a row holding exactly their covers. Migration 009
 * filled the rows for readings written before; seeds call rebuildCoverSets. A member without a
 * row is read from its readings on the fly, never taken as empty.
 */
import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';
import { type CountedSample, countedFromSorted } from '../../analysis/countedSample';
import { MemberCoverSet } from '../db/models';
import { decodeCounts, encodeSortedCovers } from './coverCountCodec';
import { decodeCovers, encodeCovers, mergeSorted } from './coverSetCodec';

type CoverSetRow = { memberId: number; covers: Buffer | Uint8Array };

/** The models' Sequelize instance (scripts and seeds bind models without the app's db()). */
function db(): Sequelize {
	const sequelize = MemberCoverSet.sequelize;
	if (!sequelize) throw new Error('the database models are not initialised');
	return sequelize;
}

const ascending = (ids: Iterable<number>) => [...new Set(ids)].sort((a, b) => a - b);

/** Members per statement when a statement lists members (keeps packets and IN lists bounded). */
const MEMBERS_PER_STATEMENT = 500;

function chunks<T>(items: readonly T[], size = MEMBERS_PER_STATEMENT): T[][] {
	const out: T[][] = [];
	for (let i = 0; i < items.length; i += size) out.push(items.slice(i, i + size));
	return out;
}

/** Covers of members straight from the readings table, sorted, by member id. */
async function coversFromReadings(
	sequelize: Sequelize,
	memberIds: readonly number[],
	transaction?: Transaction
): Promise<Map<number, Float64Array>> {
	const out = new Map<number, Float64Array>();
	for (const part of chunks(memberIds)) {
		const rows = await sequelize.query<{ memberId: number; coverMm: number }>(
			'SELECT member_id AS memberId, cover_mm AS coverMm FROM readings WHERE member_id IN (:part)',
			{ type: QueryTypes.SELECT, replacements: { part }, transaction }
		);
		const lists = new Map<number, number[]>();
		for (const r of rows) {
			const list = lists.get(r.memberId) ?? [];
			list.push(Number(r.coverMm));
			lists.set(r.memberId, list);
		}
		for (const [memberId, list] of lists) out.set(memberId, Float64Array.from(list).sort());
	}
	return out;
}

/** One row a member, read by primary key (EXPLAIN in tests/integration/populations.test.ts). */
export const COVER_SETS_SQL =
	'SELECT member_id AS memberId, covers_mm AS covers FROM member_cover_sets WHERE member_id IN (:part)';

/**
 * Every cover of the given members, sorted, by member id; members with no readings are absent.
 * Reads run on a replica when there is one (the covers of a committed import replicate with it).
 */
export async function readCoverSets(
	memberIds: readonly number[],
	transaction?: Transaction
): Promise<Map<number, Float64Array>> {
	const sequelize = db();
	const out = new Map<number, Float64Array>();
	const ids = ascending(memberIds);
	const stored = new Set<number>();
	for (const part of chunks(ids)) {
		const rows = await sequelize.query<CoverSetRow>(COVER_SETS_SQL, {
			type: QueryTypes.SELECT,
			replacements: { part },
			transaction
		});
		for (const row of rows) {
			stored.add(row.memberId);
			const covers = decodeCovers(row.covers);
			if (covers.length > 0) out.set(row.memberId, covers);
		}
	}
	const missing = ids.filter((id) => !stored.has(id));
	if (missing.length > 0) {
		for (const [id, covers] of await coversFromReadings(sequelize, missing, transaction))
			out.set(id, covers);
	}
	return out;
}

/** One row a member, only the counts (the covers blob stays unread). */
export const COVER_COUNTS_SQL =
	'SELECT member_id AS memberId, grid_den AS den, grid_factor AS factor, cover_counts AS counts FROM member_cover_sets WHERE member_id IN (:part)';

type CoverCountRow = {
	memberId: number;
	den: number | null;
	factor: number | null;
	counts: Buffer | Uint8Array | null;
};

/**
 * Each member's covers as counts of distinct values (analysis/countedSample.ts), by member id;
 * members with no readings are absent. Reads one short row a member: the cost is the number of
 * distinct covers, not of readings. A member without stored counts is counted from its readings.
 */
export async function readCoverCounts(
	memberIds: readonly number[],
	transaction?: Transaction
): Promise<Map<number, CountedSample>> {
	const sequelize = db();
	const out = new Map<number, CountedSample>();
	const ids = ascending(memberIds);
	const stored = new Set<number>();
	for (const part of chunks(ids)) {
		const rows = await sequelize.query<CoverCountRow>(COVER_COUNTS_SQL, {
			type: QueryTypes.SELECT,
			replacements: { part },
			transaction
		});
		for (const row of rows) {
			if (row.counts === null) continue;
			stored.add(row.memberId);
			const grid =
				row.den === null || row.factor === null
					? null
					: { den: Number(row.den), factor: Number(row.factor) };
			const counted = decodeCounts(row.counts, grid);
			if (counted.n > 0) out.set(row.memberId, counted);
		}
	}
	const missing = ids.filter((id) => !stored.has(id));
	if (missing.length > 0) {
		for (const [id, covers] of await coversFromReadings(sequelize, missing, transaction))
			out.set(id, countedFromSorted(covers));
	}
	return out;
}

/** How many readings each member has (members with none are absent). */
export async function readingCounts(memberIds: readonly number[]): Promise<Map<number, number>> {
	const sequelize = db();
	const ids = ascending(memberIds);
	const counts = new Map<number, number>();
	const stored = new Set<number>();
	for (const part of chunks(ids)) {
		const rows = await sequelize.query<{ memberId: number; n: number }>(
			'SELECT member_id AS memberId, reading_count AS n FROM member_cover_sets WHERE member_id IN (:part)',
			{ type: QueryTypes.SELECT, replacements: { part } }
		);
		for (const r of rows) {
			stored.add(r.memberId);
			if (Number(r.n) > 0) counts.set(r.memberId, Number(r.n));
		}
	}
	const missing = ids.filter((id) => !stored.has(id));
	for (const part of chunks(missing)) {
		const rows = await sequelize.query<{ memberId: number; n: number }>(
			'SELECT member_id AS memberId, COUNT(*) AS n FROM readings WHERE member_id IN (:part) GROUP BY member_id',
			{ type: QueryTypes.SELECT, replacements: { part } }
		);
		for (const r of rows) counts.set(r.memberId, Number(r.n));
	}
	return counts;
}

/**
 * Locks the members' cover-set rows until the transaction ends, creating empty ones first, in
 * ascending member order so that two imports into the same members queue rather than deadlock.
 * Answers the stored covers.
 */
async function lockCoverSets(
	transaction: Transaction,
	memberIds: readonly number[]
): Promise<Map<number, Float64Array>> {
	const sequelize = db();
	const locked = new Map<number, Float64Array>();
	for (const part of chunks(ascending(memberIds))) {
		await sequelize.query(
			`INSERT IGNORE INTO member_cover_sets (member_id, reading_count, covers_mm) VALUES ${part
				.map(() => "(?, 0, '')")
				.join(', ')}`,
			{ type: QueryTypes.INSERT, replacements: part, transaction }
		);
		const rows = await sequelize.query<CoverSetRow>(
			'SELECT member_id AS memberId, covers_mm AS covers FROM member_cover_sets WHERE member_id IN (:part) ORDER BY member_id FOR UPDATE',
			{ type: QueryTypes.SELECT, replacements: { part }, transaction }
		);
		for (const row of rows) locked.set(row.memberId, decodeCovers(row.covers));
	}
	return locked;
}

async function storeCoverSet(transaction: Transaction, memberId: number, covers: Float64Array) {
	// The counts come from the same sorted covers in the same UPDATE: they cannot drift apart.
	const counts = encodeSortedCovers(covers);
	await db().query(
		`UPDATE member_cover_sets SET reading_count = ?, covers_mm = ?, grid_den = ?, grid_factor = ?,
		        distinct_covers = ?, cover_counts = ?, updated_at = CURRENT_TIMESTAMP(3)
		  WHERE member_id = ?`,
		{
			type: QueryTypes.UPDATE,
			replacements: [
				covers.length,
				encodeCovers(covers),
				counts.grid?.den ?? null,
				counts.grid?.factor ?? null,
				counts.distinct,
				counts.bytes,
				memberId
			],
			transaction
		}
	);
}

/**
 * Adds newly written covers (sorted, by member id) to the members' cover sets, inside the
 * transaction that wrote the readings. Locks the rows, so a concurrent import into the same
 * member waits and then merges into this one's result.
 */
export async function mergeIntoCoverSets(
	transaction: Transaction,
	additions: ReadonlyMap<number, Float64Array>
): Promise<void> {
	if (additions.size === 0) return;
	const current = await lockCoverSets(transaction, [...additions.keys()]);
	for (const [memberId, added] of additions) {
		await storeCoverSet(
			transaction,
			memberId,
			mergeSorted(current.get(memberId) ?? new Float64Array(0), added)
		);
	}
}

/**
 * Recomputes the members' cover sets from their readings inside `transaction` (after an undo,
 * and for seeds and maintenance). Locks the rows first, so the readings read are final.
 */
export async function rebuildCoverSets(
	transaction: Transaction,
	memberIds: readonly number[]
): Promise<void> {
	const ids = ascending(memberIds);
	if (ids.length === 0) return;
	await lockCoverSets(transaction, ids);
	const fresh = await coversFromReadings(db(), ids, transaction);
	for (const id of ids) await storeCoverSet(transaction, id, fresh.get(id) ?? new Float64Array(0));
}
