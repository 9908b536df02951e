import { DataTypes } from 'sequelize';
import { createdAt, idColumn, reference, tableOptions } from './columns';
import type { Migration } from './types';

// Copied literals, not imported: a migration must not change when the live word lists do.
const IMPORT_STATES = ['pending', 'running', 'completed', 'failed', 'cancelled', 'undone'] as const;
const ATTACHMENT_KINDS = ['photo', 'drawing', 'meter-file', 'other'] as const;

/** Cover readings, the import batches that brought them, check holes, attachments, templates. */
export const readings: Migration = {
	name: '003-readings',
	async up({ context: qi }) {
		await qi.createTable(
			'import_batches',
			{
				id: idColumn,
				survey_id: reference('surveys'),
				created_by_user_id: reference('users', { allowNull: true, onDelete: 'SET NULL' }),
				source_format: { type: DataTypes.ENUM('csv', 'xlsx', 'manual'), allowNull: false },
				file_name: { type: DataTypes.STRING(255), allowNull: true },
				file_sha256: { type: DataTypes.CHAR(64), allowNull: true },
				file_bytes: { type: DataTypes.BIGINT.UNSIGNED, allowNull: true },
				state: {
					type: DataTypes.ENUM(...IMPORT_STATES),
					allowNull: false,
					defaultValue: 'pending'
				},
				rows_total: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 },
				rows_imported: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 },
				rows_rejected: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 },
				mapping: { type: DataTypes.JSON, allowNull: true },
				options: { type: DataTypes.JSON, allowNull: true },
				warnings: { type: DataTypes.JSON, allowNull: true },
				rejected_rows_csv: { type: DataTypes.TEXT('medium'), allowNull: true },
				error_message: { type: DataTypes.STRING(1000), allowNull: true },
				cancel_requested: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
				heartbeat_at: { type: DataTypes.DATE(3), allowNull: true },
				finished_at: { type: DataTypes.DATE(3), allowNull: true },
				undone_at: { type: DataTypes.DATE(3), allowNull: true },
				undone_by_user_id: reference('users', { allowNull: true, onDelete: 'SET NULL' }),
				...createdAt
			},
			tableOptions
		);
		await qi.addIndex('import_batches', ['survey_id', 'file_sha256']);
		await qi.addIndex('import_batches', ['state']);
		await qi.createTable(
			'readings',
			{
				id: { type: DataTypes.BIGINT.UNSIGNED, autoIncrement: true, primaryKey: true },
				member_id: reference('members'),
				import_batch_id: reference('import_batches', { allowNull: true, onDelete: 'SET NULL' }),
				x_mm: { type: DataTypes.DOUBLE, allowNull: true },
				y_mm: { type: DataTypes.DOUBLE, allowNull: true },
				cover_mm: { type: DataTypes.DOUBLE, allowNull: false },
				bar_diameter_mm: { type: DataTypes.FLOAT, allowNull: true },
				bar_spacing_mm: { type: DataTypes.FLOAT, allowNull: true },
				bar_direction: { type: DataTypes.STRING(16), allowNull: true },
				// Bit flags: see src/lib/server/db/models/Reading.ts (READING_FLAGS).
				flags: { type: DataTypes.SMALLINT.UNSIGNED, allowNull: false, defaultValue: 0 },
				note: { type: DataTypes.STRING(500), allowNull: true }
			},
			tableOptions
		);
		// Covering index: a member's covers are read straight from the index (STACK.md pitfall 4).
		await qi.addIndex('readings', ['member_id', 'cover_mm'], { name: 'readings_member_cover' });
		await qi.addIndex('readings', ['import_batch_id']);
		await qi.createTable(
			'verification_holes',
			{
				id: idColumn,
				member_id: reference('members'),
				label: { type: DataTypes.STRING(80), allowNull: false },
				x_mm: { type: DataTypes.DOUBLE, allowNull: true },
				y_mm: { type: DataTypes.DOUBLE, allowNull: true },
				meter_reading_mm: { type: DataTypes.DOUBLE, allowNull: false },
				measured_cover_mm: { type: DataTypes.DOUBLE, allowNull: false },
				bar_diameter_mm: { type: DataTypes.FLOAT, allowNull: true },
				method: { type: DataTypes.STRING(80), allowNull: true },
				notes: { type: DataTypes.TEXT, allowNull: true },
				...createdAt
			},
			tableOptions
		);
		await qi.addIndex('verification_holes', ['member_id', 'label'], { unique: true });
		await qi.createTable(
			'attachments',
			{
				id: idColumn,
				survey_id: reference('surveys'),
				member_id: reference('members', { allowNull: true, onDelete: 'SET NULL' }),
				kind: { type: DataTypes.ENUM(...ATTACHMENT_KINDS), allowNull: false },
				file_name: { type: DataTypes.STRING(255), allowNull: false },
				content_type: { type: DataTypes.STRING(120), allowNull: false },
				byte_size: { type: DataTypes.BIGINT.UNSIGNED, allowNull: false },
				sha256: { type: DataTypes.CHAR(64), allowNull: false },
				storage_key: { type: DataTypes.STRING(255), allowNull: false, unique: true },
				thumbnail_key: { type: DataTypes.STRING(255), allowNull: true },
				caption: { type: DataTypes.STRING(255), allowNull: true },
				uploaded_by_user_id: reference('users', { allowNull: true, onDelete: 'SET NULL' }),
				...createdAt
			},
			tableOptions
		);
		await qi.addIndex('attachments', ['survey_id']);
		await qi.createTable(
			'column_templates',
			{
				id: idColumn,
				organisation_id: reference('organisations'),
				name: { type: DataTypes.STRING(80), allowNull: false },
				// Normalised header row, joined: a file whose headers match is offered this template.
				header_signature: { type: DataTypes.STRING(1000), allowNull: false },
				mapping: { type: DataTypes.JSON, allowNull: false },
				options: { type: DataTypes.JSON, allowNull: true },
				created_by_user_id: reference('users', { allowNull: true, onDelete: 'SET NULL' }),
				...createdAt
			},
			tableOptions
		);
		await qi.addIndex('column_templates', ['organisation_id', 'name'], { unique: true });
	},
	async down({ context: qi }) {
		for (const table of [
			'column_templates',
			'attachments',
			'verification_holes',
			'readings',
			'import_batches'
		]) {
			await qi.dropTable(table);
		}
	}
};
