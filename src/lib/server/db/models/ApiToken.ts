import {
	DataTypes,
	Model,
	type CreationOptional,
	type InferAttributes,
	type InferCreationAttributes,
	type Sequelize
} from 'sequelize';

/** A personal API token: only its sha256 is stored; the secret is shown once. */
export class ApiToken extends Model<InferAttributes<ApiToken>, InferCreationAttributes<ApiToken>> {
	declare id: CreationOptional<number>;
	declare userId: number;
	declare organisationId: number;
	declare name: string;
	declare tokenHash: string;
	declare tokenPrefix: string;
	declare expiresAt: Date | null;
	declare lastUsedAt: CreationOptional<Date | null>;
	declare revokedAt: CreationOptional<Date | null>;
	declare createdAt: CreationOptional<Date>;

	static initModel(sequelize: Sequelize) {
		ApiToken.init(
			{
				id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
				userId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
				organisationId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
				name: { type: DataTypes.STRING(80), allowNull: false },
				tokenHash: { type: DataTypes.CHAR(64), allowNull: false, unique: true },
				tokenPrefix: { type: DataTypes.STRING(16), allowNull: false },
				expiresAt: { type: DataTypes.DATE(3), allowNull: true },
				lastUsedAt: { type: DataTypes.DATE(3), allowNull: true },
				revokedAt: { type: DataTypes.DATE(3), allowNull: true },
				createdAt: DataTypes.DATE
			},
			{ sequelize, tableName: 'api_tokens', updatedAt: false }
		);
	}
}
