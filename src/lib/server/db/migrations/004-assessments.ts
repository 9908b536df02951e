import { DataTypes } from 'sequelize';
import { createdAt, idColumn, reference, tableOptions } from './columns';
import type { Migration } from './types';

// Copied literals, not imported: a migration must not change when the live word lists do.
const ASSESSMENT_STATES = ['draft', 'approved', 'superseded'] as const;

/** Signed-off assessments, shared report links, research exports and the audit trail. */
export const assessments: Migration = {
	name: '004-assessments',
	async up({ context: qi }) {
		await qi.createTable(
			'assessments',
			{
				id: idColumn,
				asset_id: reference('assets'),
				survey_id: reference('surveys', { allowNull: true, onDelete: 'SET NULL' }),
				title: { type: DataTypes.STRING(160), allowNull: false },
				state: {
					type: DataTypes.ENUM(...ASSESSMENT_STATES),
					allowNull: false,
					defaultValue: 'draft'
				},
				// The whole result as computed: populations, methods, parameters, figures, engine version.
				snapshot: { type: DataTypes.TEXT('long'), allowNull: false },
				snapshot_sha256: { type: DataTypes.CHAR(64), allowNull: false },
				engine_version: { type: DataTypes.STRING(32), allowNull: false },
				recommendations: { type: DataTypes.TEXT, allowNull: true },
				created_by_user_id: reference('users', { allowNull: true, onDelete: 'SET NULL' }),
				approved_by_user_id: reference('users', { allowNull: true, onDelete: 'SET NULL' }),
				approved_at: { type: DataTypes.DATE(3), allowNull: true },
				supersedes_id: reference('assessments', { allowNull: true, onDelete: 'SET NULL' }),
				superseded_reason: { type: DataTypes.TEXT, allowNull: true },
				...createdAt
			},
			tableOptions
		);
		await qi.addIndex('assessments', ['asset_id', 'state']);
		await qi.createTable(
			'report_links',
			{
				id: idColumn,
				assessment_id: reference('assessments'),
				token_hash: { type: DataTypes.CHAR(64), allowNull: false, unique: true },
				recipient_email: { type: DataTypes.STRING(254), allowNull: false },
				created_by_user_id: reference('users', { allowNull: true, onDelete: 'SET NULL' }),
				expires_at: { type: DataTypes.DATE(3), allowNull: false },
				revoked_at: { type: DataTypes.DATE(3), allowNull: true },
				last_opened_at: { type: DataTypes.DATE(3), allowNull: true },
				...createdAt
			},
			tableOptions
		);
		await qi.createTable(
			'research_exports',
			{
				id: idColumn,
				user_id: reference('users', { allowNull: true, onDelete: 'SET NULL' }),
				organisation_id: reference('organisations'),
				filter: { type: DataTypes.JSON, allowNull: false },
				format: { type: DataTypes.STRING(16), allowNull: false },
				row_count: { type: DataTypes.BIGINT.UNSIGNED, allowNull: true },
				engine_version: { type: DataTypes.STRING(32), allowNull: false },
				...createdAt
			},
			tableOptions
		);
		await qi.createTable(
			'audit_events',
			{
				id: { type: DataTypes.BIGINT.UNSIGNED, autoIncrement: true, primaryKey: true },
				organisation_id: reference('organisations', { allowNull: true, onDelete: 'SET NULL' }),
				user_id: reference('users', { allowNull: true, onDelete: 'SET NULL' }),
				action: { type: DataTypes.STRING(64), allowNull: false },
				subject_type: { type: DataTypes.STRING(40), allowNull: true },
				subject_id: { type: DataTypes.STRING(64), allowNull: true },
				detail: { type: DataTypes.JSON, allowNull: true },
				ip_address: { type: DataTypes.STRING(45), allowNull: true },
				...createdAt
			},
			tableOptions
		);
		await qi.addIndex('audit_events', ['organisation_id', 'created_at']);
		await qi.addIndex('audit_events', ['subject_type', 'subject_id']);
	},
	async down({ context: qi }) {
		for (const table of ['audit_events', 'research_exports', 'report_links', 'assessments']) {
			await qi.dropTable(table);
		}
	}
};
