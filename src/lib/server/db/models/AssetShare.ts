import {
	DataTypes,
	Model,
	type CreationOptional,
	type InferAttributes,
	type InferCreationAttributes,
	type Sequelize
} from 'sequelize';

/** Read-only access to an asset for another organisation (typically the asset's owner). */
export class AssetShare extends Model<
	InferAttributes<AssetShare>,
	InferCreationAttributes<AssetShare>
> {
	declare id: CreationOptional<number>;
	declare assetId: number;
	declare organisationId: number;
	declare sharedByUserId: number | null;
	declare createdAt: CreationOptional<Date>;

	static initModel(sequelize: Sequelize) {
		AssetShare.init(
			{
				id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
				assetId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
				organisationId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
				sharedByUserId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
				createdAt: DataTypes.DATE
			},
			{ sequelize, tableName: 'asset_shares', updatedAt: false }
		);
	}
}
