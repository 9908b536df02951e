import { DataTypes } from 'sequelize';
import { reference, tableOptions } from './columns';
import type { Migration } from './types';

/**
 * Live progress of a running import, one row per batch, apart from import_batches on purpose:
 * while an import's transaction inserts readings, InnoDB's foreign-key check holds a shared
 * lock on the batch's import_batches row until commit, so any other connection updating that
 * row (progress, a cancel request) would wait for the whole import. This table has no child
 * rows, so the importer and any app process can read and write it while the import runs.
 */
export const intakeProgress: Migration = {
	name: '008-intake-progress',
	async up({ context: qi }) {
		await qi.createTable(
			'import_progress',
			{
				import_batch_id: { ...reference('import_batches'), primaryKey: true },
				rows_read: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 },
				rows_written: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 },
				rows_rejected: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 },
				bytes_read: { type: DataTypes.BIGINT.UNSIGNED, allowNull: false, defaultValue: 0 },
				bytes_total: { type: DataTypes.BIGINT.UNSIGNED, allowNull: false, defaultValue: 0 },
				// The importing connection's CONNECTION_ID(), for operators (and the fault tests).
				connection_id: { type: DataTypes.BIGINT.UNSIGNED, allowNull: true },
				cancel_requested: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
				heartbeat_at: { type: DataTypes.DATE(3), allowNull: true }
			},
			tableOptions
		);
	},
	async down({ context: qi }) {
		await qi.dropTable('import_progress');
	}
};
