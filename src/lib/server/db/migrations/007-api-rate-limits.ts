import { DataTypes } from 'sequelize';
import { tableOptions } from './columns';
import type { Migration } from './types';

/**
 * API rate-limit counters, one row per caller per fixed window. Kept in MariaDB rather than in
 * process memory so several app processes behind a load balancer share one count.
 */
export const apiRateLimits: Migration = {
	name: '007-api-rate-limits',
	async up({ context: qi }) {
		await qi.createTable(
			'api_rate_counters',
			{
				bucket: { type: DataTypes.STRING(120), allowNull: false, primaryKey: true },
				window_start: { type: DataTypes.DATE, allowNull: false, primaryKey: true },
				hits: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 }
			},
			tableOptions
		);
	},
	async down({ context: qi }) {
		await qi.dropTable('api_rate_counters');
	}
};
