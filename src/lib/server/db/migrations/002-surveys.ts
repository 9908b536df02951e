import { DataTypes } from 'sequelize';
import { createdAt, idColumn, reference, tableOptions, timestamps } from './columns';
import type { Migration } from './types';

// Copied literals, not imported: a migration must not change when the live word lists do.
const DESIGN_CODES = ['EN 1992-1-1', 'ACI 318', 'project'] as const;
const MEMBER_TYPES = ['slab', 'beam', 'column', 'wall', 'footing', 'deck', 'other'] as const;
const MEMBER_FACES = ['top', 'bottom', 'side'] as const;
const SURVEY_STATES = ['draft', 'submitted', 'approved', 'returned'] as const;

const mm = (allowNull = true) => ({ type: DataTypes.DOUBLE, allowNull });

/** Structures, the surveys of them, the members surveyed and the specified cover of each. */
export const surveys: Migration = {
	name: '002-surveys',
	async up({ context: qi }) {
		await qi.createTable(
			'assets',
			{
				id: idColumn,
				organisation_id: reference('organisations'),
				name: { type: DataTypes.STRING(160), allowNull: false },
				location_text: { type: DataTypes.STRING(255), allowNull: true },
				description: { type: DataTypes.TEXT, allowNull: true },
				year_of_construction: { type: DataTypes.SMALLINT.UNSIGNED, allowNull: true },
				design_code: { type: DataTypes.ENUM(...DESIGN_CODES), allowNull: false },
				unit_system: { type: DataTypes.ENUM('mm', 'inch'), allowNull: false, defaultValue: 'mm' },
				design_service_life_years: { type: DataTypes.SMALLINT.UNSIGNED, allowNull: false },
				research_opt_in: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
				research_opt_in_changed_at: { type: DataTypes.DATE(3), allowNull: true },
				...timestamps
			},
			tableOptions
		);
		await qi.addIndex('assets', ['organisation_id', 'name']);
		await qi.createTable(
			'asset_shares',
			{
				id: idColumn,
				asset_id: reference('assets'),
				organisation_id: reference('organisations'),
				shared_by_user_id: reference('users', { allowNull: true, onDelete: 'SET NULL' }),
				...createdAt
			},
			tableOptions
		);
		await qi.addIndex('asset_shares', ['asset_id', 'organisation_id'], { unique: true });
		await qi.addIndex('asset_shares', ['organisation_id']);
		await qi.createTable(
			'surveys',
			{
				id: idColumn,
				asset_id: reference('assets'),
				title: { type: DataTypes.STRING(160), allowNull: false },
				survey_date: { type: DataTypes.DATEONLY, allowNull: false },
				surveyor_user_id: reference('users', { allowNull: true, onDelete: 'SET NULL' }),
				surveyor_name: { type: DataTypes.STRING(120), allowNull: true },
				meter_make: { type: DataTypes.STRING(120), allowNull: true },
				meter_serial: { type: DataTypes.STRING(80), allowNull: true },
				meter_calibration: { type: DataTypes.STRING(120), allowNull: true },
				status: { type: DataTypes.ENUM(...SURVEY_STATES), allowNull: false, defaultValue: 'draft' },
				status_comment: { type: DataTypes.TEXT, allowNull: true },
				notes: { type: DataTypes.TEXT, allowNull: true },
				submitted_at: { type: DataTypes.DATE(3), allowNull: true },
				reviewed_at: { type: DataTypes.DATE(3), allowNull: true },
				reviewed_by_user_id: reference('users', { allowNull: true, onDelete: 'SET NULL' }),
				...timestamps
			},
			tableOptions
		);
		await qi.addIndex('surveys', ['asset_id', 'survey_date']);
		await qi.addIndex('surveys', ['status']);
		await qi.createTable(
			'members',
			{
				id: idColumn,
				survey_id: reference('surveys'),
				// Kept beside survey_id so population queries by asset need no join through surveys.
				asset_id: reference('assets'),
				label: { type: DataTypes.STRING(80), allowNull: false },
				member_type: { type: DataTypes.ENUM(...MEMBER_TYPES), allowNull: false },
				face: { type: DataTypes.ENUM(...MEMBER_FACES), allowNull: false },
				exposure_class: { type: DataTypes.STRING(24), allowNull: false },
				requirement_source: { type: DataTypes.ENUM(...DESIGN_CODES), allowNull: false },
				structural_class: { type: DataTypes.STRING(4), allowNull: true },
				c_min_mm: mm(false),
				c_nom_mm: mm(false),
				delta_c_dev_mm: mm(false),
				delta_plus_mm: mm(),
				bar_diameter_mm: mm(),
				bar_spacing_mm: mm(),
				spacing_tolerance_mm: mm(),
				member_depth_mm: mm(),
				grid_width_mm: mm(),
				grid_height_mm: mm(),
				notes: { type: DataTypes.TEXT, allowNull: true },
				...timestamps
			},
			tableOptions
		);
		await qi.addIndex('members', ['survey_id', 'label'], { unique: true });
		await qi.addIndex('members', ['asset_id', 'member_type', 'exposure_class']);
		await qi.addIndex('members', ['survey_id', 'member_type', 'exposure_class']);
	},
	async down({ context: qi }) {
		for (const table of ['members', 'surveys', 'asset_shares', 'assets']) {
			await qi.dropTable(table);
		}
	}
};
