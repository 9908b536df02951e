import {
	DataTypes,
	Model,
	type CreationOptional,
	type InferAttributes,
	type InferCreationAttributes,
	type Sequelize
} from 'sequelize';

/** A JSON document in a TEXT column, parsed on read and written as text. */
function jsonText(column: 'settings' | 'populations' | 'result', long = false) {
	return {
		type: long ? DataTypes.TEXT('medium') : DataTypes.TEXT,
		allowNull: false,
		get(this: SurveyPlan) {
			return JSON.parse(this.getDataValue(column) as unknown as string);
		},
		set(this: SurveyPlan, value: unknown) {
			this.setDataValue(column, JSON.stringify(value) as never);
		}
	};
}

/** A survey's plan (src/lib/server/planning): inputs as chosen and the engine's answer. */
export class SurveyPlan extends Model<
	InferAttributes<SurveyPlan>,
	InferCreationAttributes<SurveyPlan>
> {
	declare id: CreationOptional<number>;
	declare surveyId: number;
	declare settings: unknown;
	declare populations: unknown;
	declare result: unknown;
	declare engineVersion: string;
	declare updatedByUserId: number | null;
	declare createdAt: CreationOptional<Date>;
	declare updatedAt: CreationOptional<Date>;

	static initModel(sequelize: Sequelize) {
		SurveyPlan.init(
			{
				id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
				surveyId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
				settings: jsonText('settings'),
				populations: jsonText('populations'),
				result: jsonText('result', true),
				engineVersion: { type: DataTypes.STRING(40), allowNull: false },
				updatedByUserId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
				createdAt: DataTypes.DATE,
				updatedAt: DataTypes.DATE
			},
			{ sequelize, tableName: 'survey_plans' }
		);
	}
}
