import { DataTypes } from 'sequelize';
import { createdAt, idColumn, reference, tableOptions, timestamps } from './columns';
import type { Migration } from './types';

// Copied literals, not imported: a migration must not change when the live word lists do.
const ROLES = ['admin', 'engineer', 'surveyor', 'owner', 'researcher'] as const;

/** Organisations, people, their roles, sessions, tokens, invitations, resets, throttling, mail. */
export const accounts: Migration = {
	name: '001-accounts',
	async up({ context: qi }) {
		await qi.createTable(
			'organisations',
			{
				id: idColumn,
				name: { type: DataTypes.STRING(160), allowNull: false },
				slug: { type: DataTypes.STRING(80), allowNull: false, unique: true },
				...timestamps
			},
			tableOptions
		);
		await qi.createTable(
			'users',
			{
				id: idColumn,
				// Stored lower-cased; the case-insensitive collation makes uniqueness ignore case on purpose.
				email: { type: DataTypes.STRING(254), allowNull: false, unique: true },
				display_name: { type: DataTypes.STRING(120), allowNull: false },
				password_hash: { type: DataTypes.STRING(255), allowNull: true },
				active_organisation_id: reference('organisations', {
					allowNull: true,
					onDelete: 'SET NULL'
				}),
				...timestamps
			},
			tableOptions
		);
		await qi.createTable(
			'memberships',
			{
				id: idColumn,
				user_id: reference('users'),
				organisation_id: reference('organisations'),
				role: { type: DataTypes.ENUM(...ROLES), allowNull: false },
				...timestamps
			},
			tableOptions
		);
		await qi.addIndex('memberships', ['user_id', 'organisation_id'], { unique: true });
		await qi.createTable(
			'sessions',
			{
				id: { type: DataTypes.STRING(64), primaryKey: true },
				user_id: reference('users'),
				expires_at: { type: DataTypes.DATE(3), allowNull: false },
				user_agent: { type: DataTypes.STRING(255), allowNull: true },
				ip_address: { type: DataTypes.STRING(45), allowNull: true },
				...createdAt
			},
			tableOptions
		);
		await qi.addIndex('sessions', ['user_id']);
		await qi.createTable(
			'api_tokens',
			{
				id: idColumn,
				user_id: reference('users'),
				organisation_id: reference('organisations'),
				name: { type: DataTypes.STRING(80), allowNull: false },
				// sha256 of the secret; the secret itself is shown once and never stored.
				token_hash: { type: DataTypes.CHAR(64), allowNull: false, unique: true },
				token_prefix: { type: DataTypes.STRING(16), allowNull: false },
				expires_at: { type: DataTypes.DATE(3), allowNull: true },
				last_used_at: { type: DataTypes.DATE(3), allowNull: true },
				revoked_at: { type: DataTypes.DATE(3), allowNull: true },
				...createdAt
			},
			tableOptions
		);
		await qi.createTable(
			'invitations',
			{
				id: idColumn,
				organisation_id: reference('organisations'),
				email: { type: DataTypes.STRING(254), allowNull: false },
				role: { type: DataTypes.ENUM(...ROLES), allowNull: false },
				token_hash: { type: DataTypes.CHAR(64), allowNull: false, unique: true },
				invited_by_user_id: reference('users', { allowNull: true, onDelete: 'SET NULL' }),
				expires_at: { type: DataTypes.DATE(3), allowNull: false },
				accepted_at: { type: DataTypes.DATE(3), allowNull: true },
				revoked_at: { type: DataTypes.DATE(3), allowNull: true },
				...createdAt
			},
			tableOptions
		);
		await qi.createTable(
			'password_resets',
			{
				id: idColumn,
				user_id: reference('users'),
				token_hash: { type: DataTypes.CHAR(64), allowNull: false, unique: true },
				expires_at: { type: DataTypes.DATE(3), allowNull: false },
				used_at: { type: DataTypes.DATE(3), allowNull: true },
				...createdAt
			},
			tableOptions
		);
		await qi.createTable(
			'sign_in_throttles',
			{
				id: idColumn,
				scope: { type: DataTypes.ENUM('account', 'address', 'token'), allowNull: false },
				subject: { type: DataTypes.STRING(254), allowNull: false },
				failures: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 },
				locked_until: { type: DataTypes.DATE(3), allowNull: true },
				...timestamps
			},
			tableOptions
		);
		await qi.addIndex('sign_in_throttles', ['scope', 'subject'], { unique: true });
		await qi.createTable(
			'mail_outbox',
			{
				id: idColumn,
				organisation_id: reference('organisations', { allowNull: true, onDelete: 'SET NULL' }),
				to_address: { type: DataTypes.STRING(254), allowNull: false },
				subject: { type: DataTypes.STRING(255), allowNull: false },
				text_body: { type: DataTypes.TEXT, allowNull: false },
				html_body: { type: DataTypes.TEXT, allowNull: true },
				state: {
					type: DataTypes.ENUM('queued', 'sent', 'failed'),
					allowNull: false,
					defaultValue: 'queued'
				},
				attempts: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 },
				last_error: { type: DataTypes.STRING(500), allowNull: true },
				next_attempt_at: { type: DataTypes.DATE(3), allowNull: true },
				sent_at: { type: DataTypes.DATE(3), allowNull: true },
				...timestamps
			},
			tableOptions
		);
		await qi.addIndex('mail_outbox', ['state', 'next_attempt_at']);
	},
	async down({ context: qi }) {
		for (const table of [
			'mail_outbox',
			'sign_in_throttles',
			'password_resets',
			'invitations',
			'api_tokens',
			'sessions',
			'memberships',
			'users',
			'organisations'
		]) {
			await qi.dropTable(table);
		}
	}
};
