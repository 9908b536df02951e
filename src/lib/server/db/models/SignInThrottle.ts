import {
	DataTypes,
	Model,
	type CreationOptional,
	type InferAttributes,
	type InferCreationAttributes,
	type Sequelize
} from 'sequelize';

/** Failed sign-in counters per account, per address and per token prefix; kept in MariaDB so
 * several app processes share them. */
export class SignInThrottle extends Model<
	InferAttributes<SignInThrottle>,
	InferCreationAttributes<SignInThrottle>
> {
	declare id: CreationOptional<number>;
	declare scope: 'account' | 'address' | 'token';
	declare subject: string;
	declare failures: CreationOptional<number>;
	declare lockedUntil: CreationOptional<Date | null>;
	declare createdAt: CreationOptional<Date>;
	declare updatedAt: CreationOptional<Date>;

	static initModel(sequelize: Sequelize) {
		SignInThrottle.init(
			{
				id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
				scope: { type: DataTypes.ENUM('account', 'address', 'token'), allowNull: false },
				subject: { type: DataTypes.STRING(254), allowNull: false },
				failures: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 },
				lockedUntil: { type: DataTypes.DATE(3), allowNull: true },
				createdAt: DataTypes.DATE,
				updatedAt: DataTypes.DATE
			},
			{ sequelize, tableName: 'sign_in_throttles' }
		);
	}
}
