import { DataTypes } from 'sequelize';
import type { Migration } from './types';

/**
 * Each member's covers also as counts of distinct values on the meter's grid
 * (readings/coverCountCodec.ts), in the member's cover-set row, so that population figures cost
 * the number of distinct covers, not of readings (docs/scaling.md). In the cover-set row rather
 * than a table of its own: the same row lock and the same UPDATE keep both in step with the
 * readings, and a reader selecting only the counts leaves the long covers blob unread.
 * Not filled here: a migration imports no live code (the codec may change after it), so members
 * stored before it keep null counts, which readers take from the readings, until their next write
 * rewrites the row; `npm run db:check-summaries` lists them as "cover counts not written".
 */

export const coverCounts: Migration = {
	name: '012-cover-counts',
	async up({ context: qi }) {
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
	},
	async down({ context: qi }) {
		for (const column of ['cover_counts', 'distinct_covers', 'grid_factor', 'grid_den'])
			await qi.removeColumn('member_cover_sets', column);
	}
};
