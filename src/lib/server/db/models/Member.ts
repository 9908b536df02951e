import {
	DataTypes,
	Model,
	type CreationOptional,
	type InferAttributes,
	type InferCreationAttributes,
	type Sequelize
} from 'sequelize';
import { DESIGN_CODES, MEMBER_FACES, MEMBER_TYPES } from '../../../words';
import type { DesignCode } from './Asset';

export type MemberType = (typeof MEMBER_TYPES)[number];
export type MemberFace = (typeof MEMBER_FACES)[number];

const mm = (allowNull = true) => ({ type: DataTypes.DOUBLE, allowNull });

/** A surveyed element (slab bay, beam, column...) with the cover specified for it, in mm. */
export class Member extends Model<InferAttributes<Member>, InferCreationAttributes<Member>> {
	declare id: CreationOptional<number>;
	declare surveyId: number;
	declare assetId: number;
	declare label: string;
	declare memberType: MemberType;
	declare face: MemberFace;
	/** EN 206 exposure class (XC3, XD1, XS2...) or an ACI 318 exposure category (C1, ...). */
	declare exposureClass: string;
	declare requirementSource: DesignCode;
	declare structuralClass: string | null;
	declare cMinMm: number;
	declare cNomMm: number;
	declare deltaCDevMm: number;
	declare deltaPlusMm: number | null;
	declare barDiameterMm: number | null;
	declare barSpacingMm: number | null;
	declare spacingToleranceMm: number | null;
	declare memberDepthMm: number | null;
	declare gridWidthMm: number | null;
	declare gridHeightMm: number | null;
	declare notes: CreationOptional<string | null>;
	declare createdAt: CreationOptional<Date>;
	declare updatedAt: CreationOptional<Date>;

	static initModel(sequelize: Sequelize) {
		Member.init(
			{
				id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
				surveyId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
				assetId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
				label: { type: DataTypes.STRING(80), allowNull: false },
				memberType: { type: DataTypes.ENUM(...MEMBER_TYPES), allowNull: false },
				face: { type: DataTypes.ENUM(...MEMBER_FACES), allowNull: false },
				exposureClass: { type: DataTypes.STRING(24), allowNull: false },
				requirementSource: { type: DataTypes.ENUM(...DESIGN_CODES), allowNull: false },
				structuralClass: { type: DataTypes.STRING(4), allowNull: true },
				cMinMm: mm(false),
				cNomMm: mm(false),
				deltaCDevMm: mm(false),
				deltaPlusMm: mm(),
				barDiameterMm: mm(),
				barSpacingMm: mm(),
				spacingToleranceMm: mm(),
				memberDepthMm: mm(),
				gridWidthMm: mm(),
				gridHeightMm: mm(),
				notes: { type: DataTypes.TEXT, allowNull: true },
				createdAt: DataTypes.DATE,
				updatedAt: DataTypes.DATE
			},
			{ sequelize, tableName: 'members' }
		);
	}
}
