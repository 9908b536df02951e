import {
	DataTypes,
	Model,
	type CreationOptional,
	type InferAttributes,
	type InferCreationAttributes,
	type Sequelize
} from 'sequelize';

/** Live progress of a running import (see migration 006 for why it is a table of its own). */
export class ImportProgress extends Model<
	InferAttributes<ImportProgress>,
	InferCreationAttributes<ImportProgress>
> {
	declare importBatchId: number;
	declare rowsRead: CreationOptional<number>;
	declare rowsWritten: CreationOptional<number>;
	declare rowsRejected: CreationOptional<number>;
	declare bytesRead: CreationOptional<number>;
	declare bytesTotal: CreationOptional<number>;
	declare connectionId: CreationOptional<number | null>;
	declare cancelRequested: CreationOptional<boolean>;
	declare heartbeatAt: CreationOptional<Date | null>;

	static initModel(sequelize: Sequelize) {
		ImportProgress.init(
			{
				importBatchId: { type: DataTypes.INTEGER.UNSIGNED, primaryKey: true },
				rowsRead: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 },
				rowsWritten: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 },
				rowsRejected: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 },
				bytesRead: { type: DataTypes.BIGINT.UNSIGNED, allowNull: false, defaultValue: 0 },
				bytesTotal: { type: DataTypes.BIGINT.UNSIGNED, allowNull: false, defaultValue: 0 },
				connectionId: { type: DataTypes.BIGINT.UNSIGNED, allowNull: true },
				cancelRequested: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
				heartbeatAt: { type: DataTypes.DATE(3), allowNull: true }
			},
			{ sequelize, tableName: 'import_progress', timestamps: false }
		);
	}
}
