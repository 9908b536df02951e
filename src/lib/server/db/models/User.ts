import {
	DataTypes,
	Model,
	type CreationOptional,
	type InferAttributes,
	type InferCreationAttributes,
	type Sequelize
} from 'sequelize';

export class User extends Model<InferAttributes<User>, InferCreationAttributes<User>> {
	declare id: CreationOptional<number>;
	/** Always lower-cased before it is stored; the column's collation ignores case as well. */
	declare email: string;
	declare displayName: string;
	declare passwordHash: string | null;
	declare activeOrganisationId: number | null;
	declare createdAt: CreationOptional<Date>;
	declare updatedAt: CreationOptional<Date>;

	static initModel(sequelize: Sequelize) {
		User.init(
			{
				id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
				email: {
					type: DataTypes.STRING(254),
					allowNull: false,
					unique: true,
					set(value: string) {
						this.setDataValue('email', value.trim().toLowerCase());
					}
				},
				displayName: { type: DataTypes.STRING(120), allowNull: false },
				passwordHash: { type: DataTypes.STRING(255), allowNull: true },
				activeOrganisationId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
				createdAt: DataTypes.DATE,
				updatedAt: DataTypes.DATE
			},
			{ sequelize, tableName: 'users' }
		);
	}
}
