import { DataTypes } from 'sequelize';
import { createdAt, idColumn, reference, tableOptions } from './columns';
import type { Migration } from './types';

/**
 * Populations the engineer makes: a named set of members of one asset, judged like any other.
 * The members are a JSON list of ids in TEXT (read whole, never queried inside), so whatever
 * stores the covers, the population is the same query over these ids. `split_from` keeps the
 * group the members were taken out of ("deck|XD3"), so the overview shows what came from what.
 */
export const customPopulations: Migration = {
	name: '015-custom-populations',
	async up({ context: qi }) {
		await qi.createTable(
			'custom_populations',
			{
				id: idColumn,
				asset_id: reference('assets'),
				name: { type: DataTypes.STRING(120), allowNull: false },
				member_ids: { type: DataTypes.TEXT, allowNull: false },
				split_from: { type: DataTypes.STRING(200), allowNull: true },
				split_from_label: { type: DataTypes.STRING(200), allowNull: true },
				created_by: reference('users', { allowNull: true, onDelete: 'SET NULL' }),
				...createdAt
			},
			tableOptions
		);
		await qi.addIndex('custom_populations', ['asset_id', 'name'], {
			unique: true,
			name: 'custom_populations_asset_name'
		});
	},
	async down({ context: qi }) {
		await qi.dropTable('custom_populations');
	}
};
