import {
	DataTypes,
	Model,
	type CreationOptional,
	type InferAttributes,
	type InferCreationAttributes,
	type NonAttribute,
	type Sequelize
} from 'sequelize';
import { CHLORIDE_BASES } from '../../../words';
import type { ChlorideIncrement } from './ChlorideIncrement';

export type ChlorideBasis = (typeof CHLORIDE_BASES)[number];

/**
 * A chloride profile taken on a member (dust or slices at depth increments, analysed for
 * chloride), with the basis of its contents and, for contents of concrete, the binder content
 * and density assumed to convert them to % of binder.
 */
export class ChlorideProfile extends Model<
	InferAttributes<ChlorideProfile>,
	InferCreationAttributes<ChlorideProfile>
> {
	declare id: CreationOptional<number>;
	declare memberId: number;
	declare label: string;
	declare xMm: number | null;
	declare yMm: number | null;
	declare testedOn: string;
	declare basis: ChlorideBasis;
	declare binderContentKgM3: number | null;
	declare concreteDensityKgM3: number | null;
	declare initialContentPercent: number | null;
	declare method: string | null;
	declare notes: string | null;
	/** The import that wrote it (migration 016); null when typed in a form. */
	declare importBatchId: CreationOptional<number | null>;
	declare createdAt: CreationOptional<Date>;
	declare increments?: NonAttribute<ChlorideIncrement[]>;

	static initModel(sequelize: Sequelize) {
		ChlorideProfile.init(
			{
				id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
				memberId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
				label: { type: DataTypes.STRING(80), allowNull: false },
				xMm: { type: DataTypes.DOUBLE, allowNull: true },
				yMm: { type: DataTypes.DOUBLE, allowNull: true },
				testedOn: { type: DataTypes.DATEONLY, allowNull: false },
				basis: { type: DataTypes.ENUM(...CHLORIDE_BASES), allowNull: false },
				binderContentKgM3: { type: DataTypes.DOUBLE, allowNull: true },
				concreteDensityKgM3: { type: DataTypes.DOUBLE, allowNull: true },
				initialContentPercent: { type: DataTypes.DOUBLE, allowNull: true },
				method: { type: DataTypes.STRING(160), allowNull: true },
				notes: { type: DataTypes.TEXT, allowNull: true },
				importBatchId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
				createdAt: DataTypes.DATE
			},
			{ sequelize, tableName: 'chloride_profiles', updatedAt: false }
		);
	}
}
