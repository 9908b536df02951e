import {
	DataTypes,
	Model,
	type InferAttributes,
	type InferCreationAttributes,
	type Sequelize
} from 'sequelize';

/** A signed-in device. Lucia's session id is the primary key (see $lib/server/auth). */
export class Session extends Model<InferAttributes<Session>, InferCreationAttributes<Session>> {
	declare id: string;
	declare userId: number;
	declare expiresAt: Date;
	declare userAgent: string | null;
	declare ipAddress: string | null;
	declare createdAt: Date;

	static initModel(sequelize: Sequelize) {
		Session.init(
			{
				id: { type: DataTypes.STRING(64), primaryKey: true },
				userId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
				expiresAt: { type: DataTypes.DATE(3), allowNull: false },
				userAgent: { type: DataTypes.STRING(255), allowNull: true },
				ipAddress: { type: DataTypes.STRING(45), allowNull: true },
				createdAt: { type: DataTypes.DATE(3), allowNull: false, defaultValue: DataTypes.NOW }
			},
			{ sequelize, tableName: 'sessions', updatedAt: false }
		);
	}
}
