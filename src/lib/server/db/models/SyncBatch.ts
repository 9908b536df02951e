import {
	DataTypes,
	Model,
	type CreationOptional,
	type InferAttributes,
	type InferCreationAttributes,
	type Sequelize
} from 'sequelize';
import { SYNC_KINDS } from '../../../words';

export type SyncKind = (typeof SYNC_KINDS)[number];

/** A batch of site entries received from a device, under the id the device gave it. */
export class SyncBatch extends Model<
	InferAttributes<SyncBatch>,
	InferCreationAttributes<SyncBatch>
> {
	declare id: CreationOptional<number>;
	declare surveyId: number;
	declare clientBatchId: string;
	declare kind: SyncKind;
	declare importBatchId: number | null;
	declare attachmentId: number | null;
	declare readingsReceived: number;
	declare holesReceived: number;
	declare receivedByUserId: number | null;
	declare createdAt: CreationOptional<Date>;

	static initModel(sequelize: Sequelize) {
		SyncBatch.init(
			{
				id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
				surveyId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
				clientBatchId: { type: DataTypes.CHAR(36), allowNull: false },
				kind: { type: DataTypes.ENUM(...SYNC_KINDS), allowNull: false },
				importBatchId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
				attachmentId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
				readingsReceived: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
				holesReceived: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
				receivedByUserId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
				createdAt: DataTypes.DATE
			},
			{ sequelize, tableName: 'sync_batches', updatedAt: false }
		);
	}
}
