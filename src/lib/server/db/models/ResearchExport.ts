import {
	DataTypes,
	Model,
	type CreationOptional,
	type InferAttributes,
	type InferCreationAttributes,
	type Sequelize
} from 'sequelize';

/** A record of one research export: what was asked, how many rows, which engine, when. */
export class ResearchExport extends Model<
	InferAttributes<ResearchExport>,
	InferCreationAttributes<ResearchExport>
> {
	declare id: CreationOptional<number>;
	declare userId: number | null;
	declare organisationId: number;
	declare filter: unknown;
	declare format: string;
	declare rowCount: number | null;
	declare engineVersion: string;
	declare createdAt: CreationOptional<Date>;

	static initModel(sequelize: Sequelize) {
		ResearchExport.init(
			{
				id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
				userId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
				organisationId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
				filter: { type: DataTypes.JSON, allowNull: false },
				format: { type: DataTypes.STRING(16), allowNull: false },
				rowCount: { type: DataTypes.BIGINT.UNSIGNED, allowNull: true },
				engineVersion: { type: DataTypes.STRING(32), allowNull: false },
				createdAt: DataTypes.DATE
			},
			{ sequelize, tableName: 'research_exports', updatedAt: false }
		);
	}
}
