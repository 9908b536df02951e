import {
	DataTypes,
	Model,
	type CreationOptional,
	type InferAttributes,
	type InferCreationAttributes,
	type Sequelize
} from 'sequelize';

/** An intrusive check: the meter's reading beside the cover measured in a drilled hole, in mm. */
export class VerificationHole extends Model<
	InferAttributes<VerificationHole>,
	InferCreationAttributes<VerificationHole>
> {
	declare id: CreationOptional<number>;
	declare memberId: number;
	declare label: string;
	declare xMm: number | null;
	declare yMm: number | null;
	declare meterReadingMm: number;
	declare measuredCoverMm: number;
	declare barDiameterMm: number | null;
	declare method: string | null;
	declare notes: CreationOptional<string | null>;
	declare createdAt: CreationOptional<Date>;

	static initModel(sequelize: Sequelize) {
		VerificationHole.init(
			{
				id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
				memberId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
				label: { type: DataTypes.STRING(80), allowNull: false },
				xMm: { type: DataTypes.DOUBLE, allowNull: true },
				yMm: { type: DataTypes.DOUBLE, allowNull: true },
				meterReadingMm: { type: DataTypes.DOUBLE, allowNull: false },
				measuredCoverMm: { type: DataTypes.DOUBLE, allowNull: false },
				barDiameterMm: { type: DataTypes.FLOAT, allowNull: true },
				method: { type: DataTypes.STRING(80), allowNull: true },
				notes: { type: DataTypes.TEXT, allowNull: true },
				createdAt: DataTypes.DATE
			},
			{ sequelize, tableName: 'verification_holes', updatedAt: false }
		);
	}
}
