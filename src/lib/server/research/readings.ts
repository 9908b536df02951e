import { QueryTypes, type Sequelize } from 'sequelize';
import { READING_FLAGS } from '../db/models/Reading';
import type { SelectedMember } from './members';
import type { ResearchReading } from './schemas';

/**
 * Opted-in readings in id order, a batch at a time (keyset pagination: `r.id > last`), so an
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

export interface ReadingBatch {
	rows: ResearchReading[];
	/** Database id of the last reading read: the next batch starts after it. */
	lastId: number | null;
}

/** One batch after `afterId`, up to `untilId` (a snapshot bound, so a long export is stable). */
export async function readingBatch(
	sequelize: Sequelize,
	members: ReadonlyMap<number, SelectedMember>,
	afterId: number,
	limit: number,
	untilId: number = Number.MAX_SAFE_INTEGER
): Promise<ReadingBatch> {
	if (members.size === 0) return { rows: [], lastId: null };
	// No joins here: the members are already selected, so the batch is a range of the primary
	// key read in order and stopped at the limit. (Joined to surveys and assets, MariaDB used a
	// join buffer and sorted every later reading for each batch, making an export quadratic.)
	const rows = await sequelize.query<ReadingRow>(
		`SELECT r.id, r.member_id AS memberId, r.x_mm AS xMm, r.y_mm AS yMm, r.cover_mm AS coverMm,
		        r.bar_diameter_mm AS barDiameterMm, r.bar_spacing_mm AS barSpacingMm, r.flags
		   FROM readings r FORCE INDEX (PRIMARY)
		  WHERE r.id > :afterId AND r.id <= :untilId AND r.member_id IN (:memberIds)
		  ORDER BY r.id LIMIT :limit`,
		{
			type: QueryTypes.SELECT,
			replacements: { afterId, untilId, limit, memberIds: [...members.keys()] }
		}
	);
	const out: ResearchReading[] = [];
	for (const row of rows) {
		const member = members.get(row.memberId);
		if (member) out.push(toResearchReading(row, member));
	}
	return { rows: out, lastId: rows.length ? rows[rows.length - 1].id : null };
}

/** Every batch of the selection up to the newest reading at the time of the call. */
export async function* readingBatches(
	sequelize: Sequelize,
	members: ReadonlyMap<number, SelectedMember>,
	batchRows = DEFAULT_BATCH_ROWS
): AsyncGenerator<ResearchReading[]> {
	const untilId = await newestReadingId(sequelize);
	let afterId = 0;
	for (;;) {
		const batch = await readingBatch(sequelize, members, afterId, batchRows, untilId);
		if (batch.lastId === null) return;
		afterId = batch.lastId;
		if (batch.rows.length) yield batch.rows;
	}
}

export async function newestReadingId(sequelize: Sequelize): Promise<number> {
	const row = await sequelize.query<{ id: number | null }>('SELECT MAX(id) AS id FROM readings', {
		type: QueryTypes.SELECT,
		plain: true
	});
	return Number(row?.id ?? 0);
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
