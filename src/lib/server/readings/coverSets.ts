/**
 * Each member's summary row (member_cover_sets): its reading count and the count of each
 * distinct cover (coverCountCodec.ts), which every population statistic reads. Every write of
 * readings updates the row in the same transaction under its row lock (import: the new covers'
 * counts added; undo, edits and deletes: recounted from the readings), so the population overview
 * reads one short row a member instead of its readings (docs/performance.md, "Pages").
 * The invariant: a member with readings has a row whose counts are exactly its covers'. The
 * sorted covers themselves (8 bytes a reading, migration 009) were kept here until migration
 * 018; nothing read them but the write path. A member without a row, or one whose counts were
 * never written (stored before migration 012), is counted from its readings on the fly, never
 * taken as empty.
 */
import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';
import {
	type CountedSample,
	countedFromSorted,
	countedFromTally
} from '../../analysis/countedSample';
import { MemberCoverSet } from '../db/models';
import { decodeCounts, encodeCounts } from './coverCountCodec';

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

/**
 * One row a member, read by primary key (EXPLAIN in tests/integration/populations.test.ts). The
 * rows are short now (counts only), so on a small table the optimiser may judge a whole scan
 * cheaper and read every member's row; the index is named so an asset reads its own rows only,
 * whatever the table's size.
 */
export const COVER_COUNTS_SQL =
	'SELECT member_id AS memberId, grid_den AS den, grid_factor AS factor, cover_counts AS counts FROM member_cover_sets FORCE INDEX (PRIMARY) WHERE member_id IN (:part)';

type CoverCountRow = {
	memberId: number;
	den: number | null;
	factor: number | null;
	counts: Buffer | Uint8Array | null;
};

/** A row's grid, or null off every grid. */
const gridOf = (row: { den: number | null; factor: number | null }) =>
	row.den === null || row.factor === null
		? null
		: { den: Number(row.den), factor: Number(row.factor) };

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
			const counted = decodeCounts(row.counts, gridOf(row));
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
			'SELECT member_id AS memberId, reading_count AS n FROM member_cover_sets FORCE INDEX (PRIMARY) WHERE member_id IN (:part)',
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

/** A locked row's counts: stored, none yet (a new row), or to be recounted from the readings. */
type LockedCounts = CountedSample | 'empty' | 'recount';

/**
 * Locks the members' summary rows until the transaction ends, creating empty ones first, in
 * ascending member order so that two imports into the same members queue rather than deadlock.
 * By primary key always: a scan would lock every row it passes, so imports into other members
 * would queue too.
 * Answers each row's stored counts, read under the lock (the latest committed, not the
 * transaction's snapshot).
 */
async function lockSummaries(
	transaction: Transaction,
	memberIds: readonly number[]
): Promise<Map<number, LockedCounts>> {
	const sequelize = db();
	const locked = new Map<number, LockedCounts>();
	for (const part of chunks(ascending(memberIds))) {
		await sequelize.query(
			`INSERT IGNORE INTO member_cover_sets (member_id, reading_count) VALUES ${part
				.map(() => '(?, 0)')
				.join(', ')}`,
			{ type: QueryTypes.INSERT, replacements: part, transaction }
		);
		const rows = await sequelize.query<CoverCountRow & { n: number }>(
			`SELECT member_id AS memberId, reading_count AS n, grid_den AS den, grid_factor AS factor,
			        cover_counts AS counts
			   FROM member_cover_sets FORCE INDEX (PRIMARY)
			  WHERE member_id IN (:part) ORDER BY member_id FOR UPDATE`,
			{ type: QueryTypes.SELECT, replacements: { part }, transaction }
		);
		for (const row of rows) {
			if (row.counts !== null) locked.set(row.memberId, decodeCounts(row.counts, gridOf(row)));
			else locked.set(row.memberId, Number(row.n) === 0 ? 'empty' : 'recount');
		}
	}
	return locked;
}

async function storeCounts(transaction: Transaction, memberId: number, sample: CountedSample) {
	const counts = encodeCounts(sample);
	await db().query(
		`UPDATE member_cover_sets SET reading_count = ?, grid_den = ?, grid_factor = ?,
		        distinct_covers = ?, cover_counts = ?, updated_at = CURRENT_TIMESTAMP(3)
		  WHERE member_id = ?`,
		{
			type: QueryTypes.UPDATE,
			replacements: [
				sample.n,
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
 * Adds newly written covers (sorted, by member id) to the members' counts, inside the
 * transaction that wrote the readings. Locks the rows, so a concurrent import into the same
 * member waits and then adds to this one's result. The cost is the member's distinct covers,
 * not its readings: a hundred readings added to a member of a million rewrite a few kB.
 */
export async function mergeIntoCoverCounts(
	transaction: Transaction,
	additions: ReadonlyMap<number, Float64Array>
): Promise<void> {
	if (additions.size === 0) return;
	const current = await lockSummaries(transaction, [...additions.keys()]);
	const recount = [...additions.keys()].filter((id) => current.get(id) === 'recount');
	// Counts never written: the readings, this transaction's included, give them whole.
	const fresh = recount.length > 0 ? await coversFromReadings(db(), recount, transaction) : null;
	for (const [memberId, added] of additions) {
		const stored = current.get(memberId) ?? 'empty';
		let counts: CountedSample;
		if (stored === 'recount')
			counts = countedFromSorted(fresh?.get(memberId) ?? new Float64Array(0));
		else if (stored === 'empty') counts = countedFromSorted(added);
		else {
			// Tallied afresh so the grid is found on the union, as counting every cover would.
			const tally = new Map<number, number>();
			for (let i = 0; i < stored.values.length; i++) tally.set(stored.values[i], stored.counts[i]);
			for (const cover of added) tally.set(cover, (tally.get(cover) ?? 0) + 1);
			counts = countedFromTally(tally);
		}
		await storeCounts(transaction, memberId, counts);
	}
}

/**
 * Recounts the members' covers from their readings inside `transaction` (after an undo, an
 * edit or a delete, and for seeds and maintenance). Locks the rows first, so the readings read
 * are final.
 */
export async function rebuildCoverCounts(
	transaction: Transaction,
	memberIds: readonly number[]
): Promise<void> {
	const ids = ascending(memberIds);
	if (ids.length === 0) return;
	await lockSummaries(transaction, ids);
	const fresh = await coversFromReadings(db(), ids, transaction);
	for (const id of ids)
		await storeCounts(transaction, id, countedFromSorted(fresh.get(id) ?? new Float64Array(0)));
}
