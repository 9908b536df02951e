import {
	DataTypes,
	Model,
	type CreationOptional,
	type InferAttributes,
	type InferCreationAttributes,
	type Sequelize
} from 'sequelize';
import { ROLES, type Role } from '../../../words';

export type { Role };

/** A user's role in one organisation; a user may belong to several. */
export class Membership extends Model<
	InferAttributes<Membership>,
	InferCreationAttributes<Membership>
> {
	declare id: CreationOptional<number>;
	declare userId: number;
	declare organisationId: number;
	declare role: Role;
	declare createdAt: CreationOptional<Date>;
	declare updatedAt: CreationOptional<Date>;

	static initModel(sequelize: Sequelize) {
		Membership.init(
			{
				id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
				userId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
				organisationId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
				role: { type: DataTypes.ENUM(...ROLES), allowNull: false },
				createdAt: DataTypes.DATE,
				updatedAt: DataTypes.DATE
			},
			{ sequelize, tableName: 'memberships' }
		);
	}
}
