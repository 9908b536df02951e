import {
	DataTypes,
	Model,
	type CreationOptional,
	type InferAttributes,
	type InferCreationAttributes,
	type Sequelize
} from 'sequelize';

/** A saved mapping from a meter file's columns to reading fields, offered when headers match. */
export class ColumnTemplate extends Model<
	InferAttributes<ColumnTemplate>,
	InferCreationAttributes<ColumnTemplate>
> {
	declare id: CreationOptional<number>;
	declare organisationId: number;
	declare name: string;
	declare headerSignature: string;
	declare mapping: unknown;
	declare options: unknown;
	declare createdByUserId: number | null;
	declare createdAt: CreationOptional<Date>;

	static initModel(sequelize: Sequelize) {
		ColumnTemplate.init(
			{
				id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
				organisationId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
				name: { type: DataTypes.STRING(80), allowNull: false },
				headerSignature: { type: DataTypes.STRING(1000), allowNull: false },
				mapping: { type: DataTypes.JSON, allowNull: false },
				options: { type: DataTypes.JSON, allowNull: true },
				createdByUserId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
				createdAt: DataTypes.DATE
			},
			{ sequelize, tableName: 'column_templates', updatedAt: false }
		);
	}
}
