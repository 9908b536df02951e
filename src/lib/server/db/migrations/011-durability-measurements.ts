import { DataTypes } from 'sequelize';
import { createdAt, idColumn, reference, tableOptions } from './columns';
import type { Migration } from './types';

/**
 * Durability measurements taken on a member: carbonation tests (the depth of the carbonated
 * front, as read) and chloride profiles with their depth increments. They belong to the member
 * (and so to its survey): deleted with it, frozen with it.
 */

// Copied literals, not imported: a migration must not change when the live word lists do.
const CHLORIDE_BASES = ['binder', 'concrete'] as const;

const location = {
	label: { type: DataTypes.STRING(80), allowNull: false },
	x_mm: { type: DataTypes.DOUBLE, allowNull: true },
	y_mm: { type: DataTypes.DOUBLE, allowNull: true },
	tested_on: { type: DataTypes.DATEONLY, allowNull: false },
	method: { type: DataTypes.STRING(160), allowNull: true },
	notes: { type: DataTypes.TEXT, allowNull: true }
};

export const durabilityMeasurements: Migration = {
	name: '011-durability-measurements',
	async up({ context: qi }) {
		await qi.createTable(
			'carbonation_tests',
			{
				id: idColumn,
				member_id: reference('members'),
				...location,
				// The individual depths as read, mm: a JSON array of numbers, possibly empty.
				depths_mm: { type: DataTypes.TEXT, allowNull: false },
				depth_min_mm: { type: DataTypes.DOUBLE, allowNull: true },
				depth_mean_mm: { type: DataTypes.DOUBLE, allowNull: true },
				depth_max_mm: { type: DataTypes.DOUBLE, allowNull: true },
				...createdAt
			},
			tableOptions
		);
		await qi.addIndex('carbonation_tests', ['member_id', 'label'], { unique: true });
		await qi.createTable(
			'chloride_profiles',
			{
				id: idColumn,
				member_id: reference('members'),
				...location,
				basis: { type: DataTypes.ENUM(...CHLORIDE_BASES), allowNull: false },
				binder_content_kg_m3: { type: DataTypes.DOUBLE, allowNull: true },
				concrete_density_kg_m3: { type: DataTypes.DOUBLE, allowNull: true },
				initial_content_percent: { type: DataTypes.DOUBLE, allowNull: true },
				...createdAt
			},
			tableOptions
		);
		await qi.addIndex('chloride_profiles', ['member_id', 'label'], { unique: true });
		await qi.createTable(
			'chloride_increments',
			{
				id: idColumn,
				profile_id: reference('chloride_profiles'),
				position: { type: DataTypes.SMALLINT.UNSIGNED, allowNull: false },
				from_mm: { type: DataTypes.DOUBLE, allowNull: false },
				to_mm: { type: DataTypes.DOUBLE, allowNull: false },
				chloride_percent: { type: DataTypes.DOUBLE, allowNull: false },
				// The increment at the surface, which fits of the profile leave out (ASTM C1556).
				outermost: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false }
			},
			tableOptions
		);
		await qi.addIndex('chloride_increments', ['profile_id', 'position'], { unique: true });
	},
	async down({ context: qi }) {
		for (const table of ['chloride_increments', 'chloride_profiles', 'carbonation_tests']) {
			await qi.dropTable(table);
		}
	}
};
