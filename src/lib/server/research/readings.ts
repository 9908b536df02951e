import { QueryTypes, type Sequelize } from 'sequelize';
import { READING_FLAGS } from '../db/models/Reading';
import type { SelectedMember } from './members';
import type { ResearchReading } from './schemas';

/**
 * Opted-in readings in member order, then id order within a member — the readings' primary key
 * (member_id, id) — a batch at a time (keyset pagination: after this member and id), so an
 * export of any size holds one batch in memory. The note column is never selected.
 */
interface ReadingRow {
	id: number;
	memberId: number;
	xMm: number | null;
	yMm: number | null;
	coverMm: number;
	barDiameterMm: number | null;
	barSpacingMm: number | null;
	flags: number;
}

export const DEFAULT_BATCH_ROWS = 5000;

/** Where a batch starts: after this reading of this member (0, 0 before the first). */
export interface ReadingPosition {
	memberId: number;
	id: number;
}

export const START: ReadingPosition = { memberId: 0, id: 0 };

export interface ReadingBatch {
	rows: ResearchReading[];
	/** The last reading read: the next batch starts after it; null when there was none. */
	last: ReadingPosition | null;
}

/** Members asked for at once after the current one (bounds the IN list). */
const MEMBERS_PER_QUERY = 500;

const COLUMNS = `r.id, r.member_id AS memberId, r.x_mm AS xMm, r.y_mm AS yMm, r.cover_mm AS coverMm,
		        r.bar_diameter_mm AS barDiameterMm, r.bar_spacing_mm AS barSpacingMm, r.flags`;

/**
 * One batch's query: a range of the primary key, read in key order and stopped at the limit —
 * no filesort (EXPLAIN in tests/integration/research/export.test.ts), or an export would sort
 * every later reading for each batch.
 */
export function batchSql(where: string): string {
	return `SELECT ${COLUMNS} FROM readings r WHERE ${where} AND r.id <= :untilId
	  ORDER BY r.member_id, r.id LIMIT :n`;
}

/**
 * Up to `limit` readings after `after`, with ids up to `untilId` (a snapshot bound, so a long
 * export is stable). Each query is a range of the primary key read in order and stopped at the
 * limit: the rest of the current member, then the following members a few hundred at a time.
 */
export async function readingBatch(
	sequelize: Sequelize,
	members: ReadonlyMap<number, SelectedMember>,
	after: ReadingPosition,
	limit: number,
	untilId: number = Number.MAX_SAFE_INTEGER
): Promise<ReadingBatch> {
	const ids = [...members.keys()].sort((a, b) => a - b);
	const rows: ReadingRow[] = [];
	const select = (where: string, replacements: object, n: number) =>
		sequelize.query<ReadingRow>(batchSql(where), {
			type: QueryTypes.SELECT,
			replacements: { ...replacements, untilId, n }
		});
	// Appended in loops: push(...rows) of a large page would overflow the call stack.
	if (members.has(after.memberId)) {
		const own = await select(
			'r.member_id = :m AND r.id > :id',
			{ m: after.memberId, id: after.id },
			limit
		);
		for (const row of own) rows.push(row);
	}
	let next = ids.findIndex((id) => id > after.memberId);
	while (next >= 0 && next < ids.length && rows.length < limit) {
		const part = ids.slice(next, next + MEMBERS_PER_QUERY);
		for (const row of await select('r.member_id IN (:part)', { part }, limit - rows.length))
			rows.push(row);
		next += part.length;
	}
	const out: ResearchReading[] = [];
	for (const row of rows) {
		const member = members.get(row.memberId);
		if (member) out.push(toResearchReading(row, member));
	}
	const last = rows.at(-1);
	return { rows: out, last: last ? { memberId: last.memberId, id: Number(last.id) } : null };
}

/** Every batch of the selection up to the newest reading at the time of the call. */
export async function* readingBatches(
	sequelize: Sequelize,
	members: ReadonlyMap<number, SelectedMember>,
	batchRows = DEFAULT_BATCH_ROWS
): AsyncGenerator<ResearchReading[]> {
	const untilId = await newestReadingId(sequelize);
	let after = START;
	for (;;) {
		const batch = await readingBatch(sequelize, members, after, batchRows, untilId);
		if (batch.last === null) return;
		after = batch.last;
		if (batch.rows.length) yield batch.rows;
	}
}

/**
 * A bound above every reading id handed out so far: the sequence behind readings.id
 * (migration 009) gives ids in increasing order, so one drawn now exceeds them all.
 */
export async function newestReadingId(sequelize: Sequelize): Promise<number> {
	const row = await sequelize.query<{ id: number }>('SELECT NEXT VALUE FOR reading_ids AS id', {
		type: QueryTypes.SELECT,
		plain: true,
		useMaster: true
	});
	return Number(row!.id) - 1;
}

function toResearchReading(row: ReadingRow, member: SelectedMember): ResearchReading {
	const m = member.public;
	return {
		memberRef: m.memberRef,
		assetRef: m.assetRef,
		memberType: m.memberType,
		face: m.face,
		exposureClass: m.exposureClass,
		designCode: m.designCode,
		constructionDecade: m.constructionDecade,
		cMinMm: m.cMinMm,
		cNomMm: m.cNomMm,
		xMm: row.xMm,
		yMm: row.yMm,
		coverMm: row.coverMm,
		// Rounded to 0.001 mm: the subtraction must not print 1e-14 noise into a paper's data.
		deviationMm: Math.round((row.coverMm - m.cNomMm) * 1000) / 1000,
		barDiameterMm: row.barDiameterMm,
		barSpacingMm: row.barSpacingMm,
		doubtful: (row.flags & READING_FLAGS.doubtful) !== 0,
		manual: (row.flags & READING_FLAGS.manual) !== 0
	};
}
