import {
	DataTypes,
	Model,
	type CreationOptional,
	type InferAttributes,
	type InferCreationAttributes,
	type Sequelize
} from 'sequelize';

/** One depth increment of a chloride profile: from–to in mm, content % in the profile's basis. */
export class ChlorideIncrement extends Model<
	InferAttributes<ChlorideIncrement>,
	InferCreationAttributes<ChlorideIncrement>
> {
	declare id: CreationOptional<number>;
	declare profileId: number;
	/** 1 at the surface, counting inwards. */
	declare position: number;
	declare fromMm: number;
	declare toMm: number;
	declare chloridePercent: number;
	declare outermost: boolean;

	static initModel(sequelize: Sequelize) {
		ChlorideIncrement.init(
			{
				id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
				profileId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
				position: { type: DataTypes.SMALLINT.UNSIGNED, allowNull: false },
				fromMm: { type: DataTypes.DOUBLE, allowNull: false },
				toMm: { type: DataTypes.DOUBLE, allowNull: false },
				chloridePercent: { type: DataTypes.DOUBLE, allowNull: false },
				outermost: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false }
			},
			{ sequelize, tableName: 'chloride_increments', timestamps: false }
		);
	}
}
