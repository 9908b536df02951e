import {
	DataTypes,
	Model,
	type CreationOptional,
	type InferAttributes,
	type InferCreationAttributes,
	type Sequelize
} from 'sequelize';

export class Organisation extends Model<
	InferAttributes<Organisation>,
	InferCreationAttributes<Organisation>
> {
	declare id: CreationOptional<number>;
	declare name: string;
	declare slug: string;
	/** The engineer who prepared an assessment may not approve it (migration 010). */
	declare secondApproverRequired: CreationOptional<boolean>;
	declare createdAt: CreationOptional<Date>;
	declare updatedAt: CreationOptional<Date>;

	static initModel(sequelize: Sequelize) {
		Organisation.init(
			{
				id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
				name: { type: DataTypes.STRING(160), allowNull: false },
				slug: { type: DataTypes.STRING(80), allowNull: false, unique: true },
				secondApproverRequired: {
					type: DataTypes.BOOLEAN,
					allowNull: false,
					defaultValue: true
				},
				createdAt: DataTypes.DATE,
				updatedAt: DataTypes.DATE
			},
			{ sequelize, tableName: 'organisations' }
		);
	}
}
