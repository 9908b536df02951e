import { DataTypes } from 'sequelize';
import { idColumn, reference, tableOptions, timestamps } from './columns';
import type { Migration } from './types';

/**
 * A survey's plan: the settings and planned populations an engineer chose before the visit,
 * and the engine's answer to them (readings needed, operating characteristics), kept as
 * computed so the page and the site sheet show the figures the engineer saw when saving.
 * One plan a survey; deleted with it.
 */
export const surveyPlans: Migration = {
	name: '013-survey-plans',
	async up({ context: qi }) {
		await qi.createTable(
			'survey_plans',
			{
				id: idColumn,
				survey_id: reference('surveys'),
				// JSON documents in TEXT columns: read whole, never queried inside.
				settings: { type: DataTypes.TEXT, allowNull: false },
				populations: { type: DataTypes.TEXT, allowNull: false },
				result: { type: DataTypes.TEXT('medium'), allowNull: false },
				engine_version: { type: DataTypes.STRING(40), allowNull: false },
				updated_by_user_id: reference('users', { allowNull: true, onDelete: 'SET NULL' }),
				...timestamps
			},
			tableOptions
		);
		await qi.addIndex('survey_plans', ['survey_id'], { unique: true });
	},
	async down({ context: qi }) {
		await qi.dropTable('survey_plans');
	}
};
