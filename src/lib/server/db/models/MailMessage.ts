import {
	DataTypes,
	Model,
	type CreationOptional,
	type InferAttributes,
	type InferCreationAttributes,
	type Sequelize
} from 'sequelize';

export type MailState = 'queued' | 'sent' | 'failed';

/** An outgoing e-mail, kept until sent so a relay that is down loses nothing. */
export class MailMessage extends Model<
	InferAttributes<MailMessage>,
	InferCreationAttributes<MailMessage>
> {
	declare id: CreationOptional<number>;
	declare organisationId: number | null;
	declare toAddress: string;
	declare subject: string;
	declare textBody: string;
	declare htmlBody: string | null;
	declare state: CreationOptional<MailState>;
	declare attempts: CreationOptional<number>;
	declare lastError: CreationOptional<string | null>;
	declare nextAttemptAt: CreationOptional<Date | null>;
	declare sentAt: CreationOptional<Date | null>;
	declare createdAt: CreationOptional<Date>;
	declare updatedAt: CreationOptional<Date>;

	static initModel(sequelize: Sequelize) {
		MailMessage.init(
			{
				id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
				organisationId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
				toAddress: { type: DataTypes.STRING(254), allowNull: false },
				subject: { type: DataTypes.STRING(255), allowNull: false },
				textBody: { type: DataTypes.TEXT, allowNull: false },
				htmlBody: { type: DataTypes.TEXT, allowNull: true },
				state: {
					type: DataTypes.ENUM('queued', 'sent', 'failed'),
					allowNull: false,
					defaultValue: 'queued'
				},
				attempts: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 },
				lastError: { type: DataTypes.STRING(500), allowNull: true },
				nextAttemptAt: { type: DataTypes.DATE(3), allowNull: true },
				sentAt: { type: DataTypes.DATE(3), allowNull: true },
				createdAt: DataTypes.DATE,
				updatedAt: DataTypes.DATE
			},
			{ sequelize, tableName: 'mail_outbox' }
		);
	}
}
