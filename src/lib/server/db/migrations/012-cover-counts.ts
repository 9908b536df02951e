import { DataTypes, QueryTypes } from 'sequelize';
import { decodeCovers } from '../../readings/coverSetCodec';
import { encodeSortedCovers } from '../../readings/coverCountCodec';
import type { Migration } from './types';

/**
 * Each member's covers also as counts of distinct values on the meter's grid
 * (readings/coverCountCodec.ts), in the member's cover-set row, so that population figures cost
 * the number of distinct covers, not of readings (docs/scaling.md). In the cover-set row rather
 * than a table of its own: the same row lock and the same UPDATE keep both in step with the
 * readings, and a reader selecting only the counts leaves the long covers blob unread.
 * Filled here from the cover sets already stored (which hold exactly the readings' covers).
 */
const MEMBERS_PER_PASS = 200;

export const coverCounts: Migration = {
	name: '012-cover-counts',
	async up({ context: qi }) {
		const sequelize = qi.sequelize;
		// The grid: cover = (k / den) · factor (analysis/coverGrid.ts); both null off every grid.
		await qi.addColumn('member_cover_sets', 'grid_den', {
			type: DataTypes.INTEGER.UNSIGNED,
			allowNull: true
		});
		await qi.addColumn('member_cover_sets', 'grid_factor', {
			type: DataTypes.DOUBLE,
			allowNull: true
		});
		await qi.addColumn('member_cover_sets', 'distinct_covers', {
			type: DataTypes.INTEGER.UNSIGNED,
			allowNull: false,
			defaultValue: 0
		});
		// Null until written: a reader then takes the member's covers from the readings.
		await qi.addColumn('member_cover_sets', 'cover_counts', {
			type: DataTypes.BLOB('long'),
			allowNull: true
		});
		let after = 0;
		for (;;) {
			const rows = await sequelize.query<{ memberId: number; covers: Buffer }>(
				`SELECT member_id AS memberId, covers_mm AS covers FROM member_cover_sets
				  WHERE member_id > ? ORDER BY member_id LIMIT ${MEMBERS_PER_PASS}`,
				{ type: QueryTypes.SELECT, replacements: [after] }
			);
			if (rows.length === 0) break;
			for (const row of rows) {
				const stored = encodeSortedCovers(decodeCovers(row.covers));
				await sequelize.query(
					`UPDATE member_cover_sets SET grid_den = ?, grid_factor = ?, distinct_covers = ?, cover_counts = ?
					  WHERE member_id = ?`,
					{
						type: QueryTypes.UPDATE,
						replacements: [
							stored.grid?.den ?? null,
							stored.grid?.factor ?? null,
							stored.distinct,
							stored.bytes,
							row.memberId
						]
					}
				);
			}
			after = rows[rows.length - 1].memberId;
		}
	},
	async down({ context: qi }) {
		for (const column of ['cover_counts', 'distinct_covers', 'grid_factor', 'grid_den'])
			await qi.removeColumn('member_cover_sets', column);
	}
};
