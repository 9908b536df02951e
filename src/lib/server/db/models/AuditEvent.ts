import {
	DataTypes,
	Model,
	type CreationOptional,
	type InferAttributes,
	type InferCreationAttributes,
	type Sequelize
} from 'sequelize';

/** Who did what to which record, when; append-only. */
export class AuditEvent extends Model<
	InferAttributes<AuditEvent>,
	InferCreationAttributes<AuditEvent>
> {
	declare id: CreationOptional<number>;
	declare organisationId: number | null;
	declare userId: number | null;
	declare action: string;
	declare subjectType: string | null;
	declare subjectId: string | null;
	declare detail: unknown;
	declare ipAddress: string | null;
	declare createdAt: CreationOptional<Date>;

	static initModel(sequelize: Sequelize) {
		AuditEvent.init(
			{
				id: { type: DataTypes.BIGINT.UNSIGNED, autoIncrement: true, primaryKey: true },
				organisationId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
				userId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
				action: { type: DataTypes.STRING(64), allowNull: false },
				subjectType: { type: DataTypes.STRING(40), allowNull: true },
				subjectId: { type: DataTypes.STRING(64), allowNull: true },
				detail: { type: DataTypes.JSON, allowNull: true },
				ipAddress: { type: DataTypes.STRING(45), allowNull: true },
				createdAt: DataTypes.DATE
			},
			{ sequelize, tableName: 'audit_events', updatedAt: false }
		);
	}
}
