import { DataTypes, QueryTypes } from 'sequelize';
import type { Migration } from './types';

/**
 * The sorted covers (`covers_mm`, 8 bytes a reading, migration 009) leave the summary rows: every
 * statistic reads the counts (migration 012), and the write path now adds counts instead of
 * merging sorted covers (readings/coverSets.ts), so nothing reads them. At 10^8 readings they
 * held 763 MB, and every import into a member rewrote its whole blob. `down` puts them back from
 * the readings, a page of members at a time (8-byte little-endian doubles, sorted, as 009 wrote
 * them; written out here, not imported, so that this migration keeps its meaning).
 */

const PAGE = 500;

export const dropCoverSets: Migration = {
	name: '018-drop-cover-sets',
	async up({ context: qi }) {
		await qi.removeColumn('member_cover_sets', 'covers_mm');
	},
	async down({ context: qi }) {
		const sequelize = qi.sequelize;
		await qi.addColumn('member_cover_sets', 'covers_mm', {
			type: DataTypes.BLOB('long'),
			allowNull: true
		});
		let after = 0;
		for (;;) {
			const ids = (
				await sequelize.query<{ id: number }>(
					`SELECT member_id AS id FROM member_cover_sets WHERE member_id > :after ORDER BY member_id LIMIT ${PAGE}`,
					{ type: QueryTypes.SELECT, replacements: { after } }
				)
			).map((r) => Number(r.id));
			if (ids.length === 0) break;
			const readings = await sequelize.query<{ id: number; cover: number }>(
				'SELECT member_id AS id, cover_mm AS cover FROM readings WHERE member_id IN (:ids)',
				{ type: QueryTypes.SELECT, replacements: { ids } }
			);
			const byMember = new Map<number, number[]>(ids.map((id) => [id, []]));
			for (const r of readings) byMember.get(Number(r.id))!.push(Number(r.cover));
			for (const [id, covers] of byMember) {
				const sorted = Float64Array.from(covers).sort();
				const bytes = Buffer.alloc(sorted.length * 8);
				sorted.forEach((c, i) => bytes.writeDoubleLE(c, i * 8));
				await sequelize.query('UPDATE member_cover_sets SET covers_mm = ? WHERE member_id = ?', {
					replacements: [bytes, id]
				});
			}
			after = ids[ids.length - 1];
		}
		await qi.changeColumn('member_cover_sets', 'covers_mm', {
			type: DataTypes.BLOB('long'),
			allowNull: false
		});
	}
};
