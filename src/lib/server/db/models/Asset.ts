import {
	DataTypes,
	Model,
	type CreationOptional,
	type InferAttributes,
	type InferCreationAttributes,
	type Sequelize
} from 'sequelize';
import { DESIGN_CODES } from '../../../words';

export type DesignCode = (typeof DESIGN_CODES)[number];
export type UnitSystem = 'mm' | 'inch';

/** A structure: the thing an owner owns and a survey surveys. */
export class Asset extends Model<InferAttributes<Asset>, InferCreationAttributes<Asset>> {
	declare id: CreationOptional<number>;
	declare organisationId: number;
	declare name: string;
	declare locationText: string | null;
	declare description: CreationOptional<string | null>;
	declare yearOfConstruction: number | null;
	declare designCode: DesignCode;
	declare unitSystem: CreationOptional<UnitSystem>;
	declare designServiceLifeYears: number;
	/** Consent for anonymised research use; off until the owning organisation opts in. */
	declare researchOptIn: CreationOptional<boolean>;
	declare researchOptInChangedAt: CreationOptional<Date | null>;
	declare createdAt: CreationOptional<Date>;
	declare updatedAt: CreationOptional<Date>;

	static initModel(sequelize: Sequelize) {
		Asset.init(
			{
				id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
				organisationId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
				name: { type: DataTypes.STRING(160), allowNull: false },
				locationText: { type: DataTypes.STRING(255), allowNull: true },
				description: { type: DataTypes.TEXT, allowNull: true },
				yearOfConstruction: { type: DataTypes.SMALLINT.UNSIGNED, allowNull: true },
				designCode: { type: DataTypes.ENUM(...DESIGN_CODES), allowNull: false },
				unitSystem: { type: DataTypes.ENUM('mm', 'inch'), allowNull: false, defaultValue: 'mm' },
				designServiceLifeYears: { type: DataTypes.SMALLINT.UNSIGNED, allowNull: false },
				researchOptIn: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
				researchOptInChangedAt: { type: DataTypes.DATE(3), allowNull: true },
				createdAt: DataTypes.DATE,
				updatedAt: DataTypes.DATE
			},
			{ sequelize, tableName: 'assets' }
		);
	}
}
