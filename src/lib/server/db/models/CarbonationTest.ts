import {
	DataTypes,
	Model,
	type CreationOptional,
	type InferAttributes,
	type InferCreationAttributes,
	type Sequelize
} from 'sequelize';

/**
 * A carbonation test on a member: the depth of the carbonated front (an indicator such as
 * phenolphthalein sprayed on a fresh face), in mm. Readings and min/mean/max are kept as read.
 */
export class CarbonationTest extends Model<
	InferAttributes<CarbonationTest>,
	InferCreationAttributes<CarbonationTest>
> {
	declare id: CreationOptional<number>;
	declare memberId: number;
	declare label: string;
	declare xMm: number | null;
	declare yMm: number | null;
	declare testedOn: string;
	declare depthsMm: number[];
	declare depthMinMm: number | null;
	declare depthMeanMm: number | null;
	declare depthMaxMm: number | null;
	declare method: string | null;
	declare notes: string | null;
	/** The import that wrote it (migration 016); null when typed in a form. */
	declare importBatchId: CreationOptional<number | null>;
	declare createdAt: CreationOptional<Date>;

	static initModel(sequelize: Sequelize) {
		CarbonationTest.init(
			{
				id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
				memberId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
				label: { type: DataTypes.STRING(80), allowNull: false },
				xMm: { type: DataTypes.DOUBLE, allowNull: true },
				yMm: { type: DataTypes.DOUBLE, allowNull: true },
				testedOn: { type: DataTypes.DATEONLY, allowNull: false },
				// A JSON array in a TEXT column: read whole, never queried inside.
				depthsMm: {
					type: DataTypes.TEXT,
					allowNull: false,
					get() {
						return JSON.parse(this.getDataValue('depthsMm') as unknown as string) as number[];
					},
					set(value: number[]) {
						this.setDataValue('depthsMm', JSON.stringify(value) as unknown as number[]);
					}
				},
				depthMinMm: { type: DataTypes.DOUBLE, allowNull: true },
				depthMeanMm: { type: DataTypes.DOUBLE, allowNull: true },
				depthMaxMm: { type: DataTypes.DOUBLE, allowNull: true },
				method: { type: DataTypes.STRING(160), allowNull: true },
				notes: { type: DataTypes.TEXT, allowNull: true },
				importBatchId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
				createdAt: DataTypes.DATE
			},
			{ sequelize, tableName: 'carbonation_tests', updatedAt: false }
		);
	}
}
