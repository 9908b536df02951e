import {
	DataTypes,
	Model,
	type CreationOptional,
	type InferAttributes,
	type InferCreationAttributes,
	type Sequelize
} from 'sequelize';
import { ROLES } from '../../../words';
import type { Role } from './Membership';

/** An invitation to join an organisation with a role; single use, the link's secret hashed. */
export class Invitation extends Model<
	InferAttributes<Invitation>,
	InferCreationAttributes<Invitation>
> {
	declare id: CreationOptional<number>;
	declare organisationId: number;
	declare email: string;
	declare role: Role;
	declare tokenHash: string;
	declare invitedByUserId: number | null;
	declare expiresAt: Date;
	declare acceptedAt: CreationOptional<Date | null>;
	declare revokedAt: CreationOptional<Date | null>;
	declare createdAt: CreationOptional<Date>;

	static initModel(sequelize: Sequelize) {
		Invitation.init(
			{
				id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
				organisationId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
				email: { type: DataTypes.STRING(254), allowNull: false },
				role: { type: DataTypes.ENUM(...ROLES), allowNull: false },
				tokenHash: { type: DataTypes.CHAR(64), allowNull: false, unique: true },
				invitedByUserId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
				expiresAt: { type: DataTypes.DATE(3), allowNull: false },
				acceptedAt: { type: DataTypes.DATE(3), allowNull: true },
				revokedAt: { type: DataTypes.DATE(3), allowNull: true },
				createdAt: DataTypes.DATE
			},
			{ sequelize, tableName: 'invitations', updatedAt: false }
		);
	}
}
