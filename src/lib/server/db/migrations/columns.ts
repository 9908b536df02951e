import { DataTypes } from 'sequelize';

/** Column shapes that recur across tables, so each migration states only what is its own. */
export const idColumn = {
	type: DataTypes.INTEGER.UNSIGNED,
	autoIncrement: true,
	primaryKey: true
};

export const timestamps = {
	created_at: { type: DataTypes.DATE(3), allowNull: false, defaultValue: DataTypes.NOW },
	updated_at: { type: DataTypes.DATE(3), allowNull: false, defaultValue: DataTypes.NOW }
};

export const createdAt = {
	created_at: { type: DataTypes.DATE(3), allowNull: false, defaultValue: DataTypes.NOW }
};

/** A foreign key to `table`.id; cascade by default, since children mean nothing without it. */
export function reference(
	table: string,
	options: { allowNull?: boolean; onDelete?: 'CASCADE' | 'SET NULL' | 'RESTRICT' } = {}
) {
	return {
		type: DataTypes.INTEGER.UNSIGNED,
		allowNull: options.allowNull ?? false,
		references: { model: table, key: 'id' },
		onDelete: options.onDelete ?? 'CASCADE',
		onUpdate: 'CASCADE'
	};
}

export const tableOptions = { charset: 'utf8mb4', collate: 'utf8mb4_unicode_ci', engine: 'InnoDB' };
