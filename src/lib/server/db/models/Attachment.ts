import {
	DataTypes,
	Model,
	type CreationOptional,
	type InferAttributes,
	type InferCreationAttributes,
	type Sequelize
} from 'sequelize';
import { ATTACHMENT_KINDS } from '../../../words';

export type AttachmentKind = (typeof ATTACHMENT_KINDS)[number];

/** A photo, drawing or meter file kept with a survey; the bytes live in object storage. */
export class Attachment extends Model<
	InferAttributes<Attachment>,
	InferCreationAttributes<Attachment>
> {
	declare id: CreationOptional<number>;
	declare surveyId: number;
	declare memberId: number | null;
	declare kind: AttachmentKind;
	declare fileName: string;
	declare contentType: string;
	declare byteSize: number;
	declare sha256: string;
	declare storageKey: string;
	declare thumbnailKey: string | null;
	declare caption: string | null;
	declare uploadedByUserId: number | null;
	declare createdAt: CreationOptional<Date>;

	static initModel(sequelize: Sequelize) {
		Attachment.init(
			{
				id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
				surveyId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
				memberId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
				kind: { type: DataTypes.ENUM(...ATTACHMENT_KINDS), allowNull: false },
				fileName: { type: DataTypes.STRING(255), allowNull: false },
				contentType: { type: DataTypes.STRING(120), allowNull: false },
				byteSize: { type: DataTypes.BIGINT.UNSIGNED, allowNull: false },
				sha256: { type: DataTypes.CHAR(64), allowNull: false },
				storageKey: { type: DataTypes.STRING(255), allowNull: false, unique: true },
				thumbnailKey: { type: DataTypes.STRING(255), allowNull: true },
				caption: { type: DataTypes.STRING(255), allowNull: true },
				uploadedByUserId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
				createdAt: DataTypes.DATE
			},
			{ sequelize, tableName: 'attachments', updatedAt: false }
		);
	}
}
