import {
	DataTypes,
	Model,
	type CreationOptional,
	type InferAttributes,
	type InferCreationAttributes,
	type Sequelize
} from 'sequelize';

/**
 * The risk annex of one assessment: durability parameters and the figures computed from them
 * (JSON text with its sha256). Frozen with the assessment (migration 006's triggers).
 */
export class AssessmentRisk extends Model<
	InferAttributes<AssessmentRisk>,
	InferCreationAttributes<AssessmentRisk>
> {
	declare id: CreationOptional<number>;
	declare assessmentId: number;
	declare parameters: string;
	declare annex: string;
	declare annexSha256: string;
	declare engineVersion: string;
	declare createdByUserId: number | null;
	declare createdAt: CreationOptional<Date>;

	static initModel(sequelize: Sequelize) {
		AssessmentRisk.init(
			{
				id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
				assessmentId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, unique: true },
				parameters: { type: DataTypes.TEXT, allowNull: false },
				annex: { type: DataTypes.TEXT('long'), allowNull: false },
				annexSha256: { type: DataTypes.CHAR(64), allowNull: false },
				engineVersion: { type: DataTypes.STRING(32), allowNull: false },
				createdByUserId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
				createdAt: DataTypes.DATE
			},
			{ sequelize, tableName: 'assessment_risks', updatedAt: false }
		);
	}
}
