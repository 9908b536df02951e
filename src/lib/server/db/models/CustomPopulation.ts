import {
	DataTypes,
	Model,
	type CreationOptional,
	type InferAttributes,
	type InferCreationAttributes,
	type Sequelize
} from 'sequelize';

/** A population the engineer made from chosen members of one asset (migration 015). */
export class CustomPopulation extends Model<
	InferAttributes<CustomPopulation>,
	InferCreationAttributes<CustomPopulation>
> {
	declare id: CreationOptional<number>;
	declare assetId: number;
	declare name: string;
	declare memberIds: number[];
	declare splitFrom: string | null;
	declare splitFromLabel: string | null;
	declare createdBy: number | null;
	declare createdAt: CreationOptional<Date>;

	static initModel(sequelize: Sequelize) {
		CustomPopulation.init(
			{
				id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
				assetId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
				name: { type: DataTypes.STRING(120), allowNull: false },
				// A JSON array in a TEXT column: read whole, never queried inside.
				memberIds: {
					type: DataTypes.TEXT,
					allowNull: false,
					get() {
						return JSON.parse(this.getDataValue('memberIds') as unknown as string) as number[];
					},
					set(value: number[]) {
						this.setDataValue('memberIds', JSON.stringify(value) as unknown as number[]);
					}
				},
				splitFrom: { type: DataTypes.STRING(200), allowNull: true },
				splitFromLabel: { type: DataTypes.STRING(200), allowNull: true },
				createdBy: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
				createdAt: DataTypes.DATE
			},
			{ sequelize, tableName: 'custom_populations', updatedAt: false }
		);
	}
}
