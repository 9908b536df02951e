import {
	DataTypes,
	Model,
	type CreationOptional,
	type InferAttributes,
	type InferCreationAttributes,
	type Sequelize
} from 'sequelize';
import { IMPORT_KINDS, IMPORT_STATES } from '../../../words';

export type ImportKind = (typeof IMPORT_KINDS)[number];

export type ImportState = (typeof IMPORT_STATES)[number];

/** One file (or one manual entry session) of readings, written in one transaction. */
export class ImportBatch extends Model<
	InferAttributes<ImportBatch>,
	InferCreationAttributes<ImportBatch>
> {
	declare id: CreationOptional<number>;
	declare surveyId: number;
	declare createdByUserId: number | null;
	declare sourceFormat: 'csv' | 'xlsx' | 'manual';
	declare kind: CreationOptional<ImportKind>;
	declare fileName: string | null;
	declare fileSha256: string | null;
	declare fileBytes: number | null;
	declare state: CreationOptional<ImportState>;
	declare rowsTotal: CreationOptional<number>;
	declare rowsImported: CreationOptional<number>;
	declare rowsRejected: CreationOptional<number>;
	declare mapping: CreationOptional<object | null>;
	declare options: CreationOptional<object | null>;
	declare warnings: CreationOptional<string[] | null>;
	declare rejectedRowsCsv: CreationOptional<string | null>;
	declare errorMessage: CreationOptional<string | null>;
	declare cancelRequested: CreationOptional<boolean>;
	declare heartbeatAt: CreationOptional<Date | null>;
	declare finishedAt: CreationOptional<Date | null>;
	declare undoneAt: CreationOptional<Date | null>;
	declare undoneByUserId: CreationOptional<number | null>;
	/** The range of reading ids this batch wrote (undo deletes within it; migration 009). */
	declare firstReadingId: CreationOptional<number | null>;
	declare lastReadingId: CreationOptional<number | null>;
	declare createdAt: CreationOptional<Date>;

	static initModel(sequelize: Sequelize) {
		ImportBatch.init(
			{
				id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
				surveyId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
				createdByUserId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
				sourceFormat: { type: DataTypes.ENUM('csv', 'xlsx', 'manual'), allowNull: false },
				kind: {
					type: DataTypes.ENUM(...IMPORT_KINDS),
					allowNull: false,
					defaultValue: 'readings'
				},
				fileName: { type: DataTypes.STRING(255), allowNull: true },
				fileSha256: { type: DataTypes.CHAR(64), allowNull: true },
				fileBytes: { type: DataTypes.BIGINT.UNSIGNED, allowNull: true },
				state: {
					type: DataTypes.ENUM(...IMPORT_STATES),
					allowNull: false,
					defaultValue: 'pending'
				},
				rowsTotal: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 },
				rowsImported: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 },
				rowsRejected: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 },
				mapping: { type: DataTypes.JSON, allowNull: true },
				options: { type: DataTypes.JSON, allowNull: true },
				warnings: { type: DataTypes.JSON, allowNull: true },
				rejectedRowsCsv: { type: DataTypes.TEXT('medium'), allowNull: true },
				errorMessage: { type: DataTypes.STRING(1000), allowNull: true },
				cancelRequested: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
				heartbeatAt: { type: DataTypes.DATE(3), allowNull: true },
				finishedAt: { type: DataTypes.DATE(3), allowNull: true },
				undoneAt: { type: DataTypes.DATE(3), allowNull: true },
				undoneByUserId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
				firstReadingId: { type: DataTypes.BIGINT.UNSIGNED, allowNull: true },
				lastReadingId: { type: DataTypes.BIGINT.UNSIGNED, allowNull: true },
				createdAt: DataTypes.DATE
			},
			{ sequelize, tableName: 'import_batches', updatedAt: false }
		);
	}
}
