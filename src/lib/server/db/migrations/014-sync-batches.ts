import { DataTypes } from 'sequelize';
import { createdAt, idColumn, reference, tableOptions } from './columns';
import type { Migration } from './types';

/**
 * What a device has sent from site: one row per batch id the device made. The unique key
 * (survey, client batch id) is taken in the same transaction as the batch's readings and holes,
 * so a retried or doubled send of the same batch is answered from this row and writes nothing.
 */

// Copied literals, not imported: a migration must not change when the live word lists do.
const SYNC_KINDS = ['entries', 'photo'] as const;

export const syncBatches: Migration = {
	name: '014-sync-batches',
	async up({ context: qi }) {
		await qi.createTable(
			'sync_batches',
			{
				id: idColumn,
				survey_id: reference('surveys'),
				client_batch_id: { type: DataTypes.CHAR(36), allowNull: false },
				kind: { type: DataTypes.ENUM(...SYNC_KINDS), allowNull: false },
				import_batch_id: reference('import_batches', { allowNull: true, onDelete: 'SET NULL' }),
				attachment_id: reference('attachments', { allowNull: true, onDelete: 'SET NULL' }),
				readings_received: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
				holes_received: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
				received_by_user_id: reference('users', { allowNull: true, onDelete: 'SET NULL' }),
				...createdAt
			},
			tableOptions
		);
		await qi.addIndex('sync_batches', ['survey_id', 'client_batch_id'], {
			unique: true,
			name: 'sync_batches_survey_client_batch'
		});
	},
	async down({ context: qi }) {
		await qi.dropTable('sync_batches');
	}
};
