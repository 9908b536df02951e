import {
	DataTypes,
	Model,
	type CreationOptional,
	type InferAttributes,
	type InferCreationAttributes,
	type Sequelize
} from 'sequelize';
import { SURVEY_STATES } from '../../../words';

export type SurveyState = (typeof SURVEY_STATES)[number];

/** One visit to an asset with a cover meter: draft → submitted → approved or returned. */
export class Survey extends Model<InferAttributes<Survey>, InferCreationAttributes<Survey>> {
	declare id: CreationOptional<number>;
	declare assetId: number;
	declare title: string;
	declare surveyDate: string;
	declare surveyorUserId: number | null;
	declare surveyorName: string | null;
	declare meterMake: string | null;
	declare meterSerial: string | null;
	declare meterCalibration: string | null;
	declare status: CreationOptional<SurveyState>;
	declare statusComment: CreationOptional<string | null>;
	declare notes: CreationOptional<string | null>;
	declare submittedAt: CreationOptional<Date | null>;
	declare reviewedAt: CreationOptional<Date | null>;
	declare reviewedByUserId: CreationOptional<number | null>;
	declare createdAt: CreationOptional<Date>;
	declare updatedAt: CreationOptional<Date>;

	static initModel(sequelize: Sequelize) {
		Survey.init(
			{
				id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
				assetId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
				title: { type: DataTypes.STRING(160), allowNull: false },
				surveyDate: { type: DataTypes.DATEONLY, allowNull: false },
				surveyorUserId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
				surveyorName: { type: DataTypes.STRING(120), allowNull: true },
				meterMake: { type: DataTypes.STRING(120), allowNull: true },
				meterSerial: { type: DataTypes.STRING(80), allowNull: true },
				meterCalibration: { type: DataTypes.STRING(120), allowNull: true },
				status: { type: DataTypes.ENUM(...SURVEY_STATES), allowNull: false, defaultValue: 'draft' },
				statusComment: { type: DataTypes.TEXT, allowNull: true },
				notes: { type: DataTypes.TEXT, allowNull: true },
				submittedAt: { type: DataTypes.DATE(3), allowNull: true },
				reviewedAt: { type: DataTypes.DATE(3), allowNull: true },
				reviewedByUserId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
				createdAt: DataTypes.DATE,
				updatedAt: DataTypes.DATE
			},
			{ sequelize, tableName: 'surveys' }
		);
	}
}
