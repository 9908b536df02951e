import {
	DataTypes,
	Model,
	type CreationOptional,
	type InferAttributes,
	type InferCreationAttributes,
	type Sequelize
} from 'sequelize';
import { ASSESSMENT_STATES } from '../../../words';

export type AssessmentState = (typeof ASSESSMENT_STATES)[number];

/**
 * An engineer's judgement of an asset's populations, stored as the whole computed result
 * (JSON text, with its sha256) so that it reads the same whatever happens to the readings later.
 */
export class Assessment extends Model<
	InferAttributes<Assessment>,
	InferCreationAttributes<Assessment>
> {
	declare id: CreationOptional<number>;
	declare assetId: number;
	declare surveyId: number | null;
	declare title: string;
	declare state: CreationOptional<AssessmentState>;
	declare snapshot: string;
	declare snapshotSha256: string;
	declare engineVersion: string;
	declare recommendations: string | null;
	declare createdByUserId: number | null;
	declare approvedByUserId: CreationOptional<number | null>;
	declare approvedAt: CreationOptional<Date | null>;
	declare supersedesId: CreationOptional<number | null>;
	declare supersededReason: CreationOptional<string | null>;
	declare createdAt: CreationOptional<Date>;

	static initModel(sequelize: Sequelize) {
		Assessment.init(
			{
				id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
				assetId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
				surveyId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
				title: { type: DataTypes.STRING(160), allowNull: false },
				state: {
					type: DataTypes.ENUM(...ASSESSMENT_STATES),
					allowNull: false,
					defaultValue: 'draft'
				},
				snapshot: { type: DataTypes.TEXT('long'), allowNull: false },
				snapshotSha256: { type: DataTypes.CHAR(64), allowNull: false },
				engineVersion: { type: DataTypes.STRING(32), allowNull: false },
				recommendations: { type: DataTypes.TEXT, allowNull: true },
				createdByUserId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
				approvedByUserId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
				approvedAt: { type: DataTypes.DATE(3), allowNull: true },
				supersedesId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
				supersededReason: { type: DataTypes.TEXT, allowNull: true },
				createdAt: DataTypes.DATE
			},
			{
				sequelize,
				tableName: 'assessments',
				updatedAt: false,
				hooks: {
					// An approved snapshot stays as signed (migration 005's trigger is the last line).
					beforeUpdate(assessment) {
						const before = assessment.previous('state') ?? assessment.state;
						const frozen = ['snapshot', 'snapshotSha256', 'engineVersion'] as const;
						if (before !== 'draft' && frozen.some((field) => assessment.changed(field))) {
							throw new Error('An approved assessment snapshot cannot be changed.');
						}
					},
					beforeDestroy(assessment) {
						if (assessment.state !== 'draft') {
							throw new Error('An approved assessment cannot be deleted.');
						}
					}
				}
			}
		);
	}
}
