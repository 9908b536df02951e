import { DataTypes, QueryTypes } from 'sequelize';
import { reference } from './columns';
import type { Migration } from './types';

/**
 * Carbonation tests and chloride profiles come in through the readings' import path too: a
 * batch says what its file holds, and each measurement it wrote names it, so undo removes
 * exactly those. A measurement typed in a form has no batch.
 */

// Copied literals, not imported: a migration must not change when the live word lists do.
const IMPORT_KINDS = ['readings', 'carbonation', 'chloride'] as const;
const MEASUREMENT_TABLES = ['carbonation_tests', 'chloride_profiles'] as const;

export const measurementImports: Migration = {
	name: '016-measurement-imports',
	async up({ context: qi }) {
		await qi.addColumn('import_batches', 'kind', {
			type: DataTypes.ENUM(...IMPORT_KINDS),
			allowNull: false,
			defaultValue: 'readings'
		});
		for (const table of MEASUREMENT_TABLES) {
			await qi.addColumn(
				table,
				'import_batch_id',
				reference('import_batches', { allowNull: true, onDelete: 'SET NULL' })
			);
		}
	},
	async down({ context: qi }) {
		const sequelize = qi.sequelize;
		for (const table of MEASUREMENT_TABLES) {
			const keys = await sequelize.query<{ name: string }>(
				`SELECT CONSTRAINT_NAME AS name FROM information_schema.KEY_COLUMN_USAGE
				 WHERE TABLE_SCHEMA = DATABASE() AND TABLE_NAME = ? AND COLUMN_NAME = 'import_batch_id'
				   AND REFERENCED_TABLE_NAME = 'import_batches'`,
				{ replacements: [table], type: QueryTypes.SELECT }
			);
			for (const { name } of keys)
				await sequelize.query(`ALTER TABLE ${table} DROP FOREIGN KEY \`${name}\``, {
					type: QueryTypes.RAW
				});
			await qi.removeColumn(table, 'import_batch_id');
		}
		await qi.removeColumn('import_batches', 'kind');
	}
};
