import {
	DataTypes,
	Model,
	type CreationOptional,
	type InferAttributes,
	type InferCreationAttributes,
	type Sequelize
} from 'sequelize';

/** A signed, expiring, revocable link to one approved assessment's report. */
export class ReportLink extends Model<
	InferAttributes<ReportLink>,
	InferCreationAttributes<ReportLink>
> {
	declare id: CreationOptional<number>;
	declare assessmentId: number;
	declare tokenHash: string;
	declare recipientEmail: string;
	declare createdByUserId: number | null;
	declare expiresAt: Date;
	declare revokedAt: CreationOptional<Date | null>;
	declare lastOpenedAt: CreationOptional<Date | null>;
	declare createdAt: CreationOptional<Date>;

	static initModel(sequelize: Sequelize) {
		ReportLink.init(
			{
				id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
				assessmentId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
				tokenHash: { type: DataTypes.CHAR(64), allowNull: false, unique: true },
				recipientEmail: { type: DataTypes.STRING(254), allowNull: false },
				createdByUserId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
				expiresAt: { type: DataTypes.DATE(3), allowNull: false },
				revokedAt: { type: DataTypes.DATE(3), allowNull: true },
				lastOpenedAt: { type: DataTypes.DATE(3), allowNull: true },
				createdAt: DataTypes.DATE
			},
			{ sequelize, tableName: 'report_links', updatedAt: false }
		);
	}
}
