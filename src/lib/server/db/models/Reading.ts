import {
	DataTypes,
	Model,
	type CreationOptional,
	type InferAttributes,
	type InferCreationAttributes,
	type Sequelize
} from 'sequelize';

/** Bit flags on a reading. */
export const READING_FLAGS = {
	/** Entered by hand rather than imported from the meter's file. */
	manual: 1,
	/** The surveyor marked the reading as doubtful (near an edge, a lap, a duct...). */
	doubtful: 2,
	/** The meter showed its "no bar found / out of range" indication. */
	outOfRange: 4
} as const;

/** Every column an insert names: the id is left to its sequence default (migration 009). */
export const READING_INSERT_FIELDS = [
	'memberId',
	'importBatchId',
	'xMm',
	'yMm',
	'coverMm',
	'barDiameterMm',
	'barSpacingMm',
	'barDirection',
	'flags',
	'note'
] as const;

/** One cover reading over one located bar, in mm, on the member's x–y grid. */
export class Reading extends Model<InferAttributes<Reading>, InferCreationAttributes<Reading>> {
	declare id: CreationOptional<number>;
	declare memberId: number;
	declare importBatchId: number | null;
	declare xMm: number | null;
	declare yMm: number | null;
	declare coverMm: number;
	declare barDiameterMm: number | null;
	declare barSpacingMm: number | null;
	declare barDirection: string | null;
	declare flags: CreationOptional<number>;
	declare note: string | null;

	static initModel(sequelize: Sequelize) {
		Reading.init(
			{
				// Stored clustered by member, primary key (member_id, id); the id comes from the
				// sequence reading_ids as the column's default (migration 009), so inserts leave it
				// out: bulkCreate(rows, { fields: READING_INSERT_FIELDS }).
				id: { type: DataTypes.BIGINT.UNSIGNED, autoIncrement: true, primaryKey: true },
				memberId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, primaryKey: true },
				importBatchId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
				xMm: { type: DataTypes.DOUBLE, allowNull: true },
				yMm: { type: DataTypes.DOUBLE, allowNull: true },
				coverMm: { type: DataTypes.DOUBLE, allowNull: false },
				barDiameterMm: { type: DataTypes.FLOAT, allowNull: true },
				barSpacingMm: { type: DataTypes.FLOAT, allowNull: true },
				barDirection: { type: DataTypes.STRING(16), allowNull: true },
				flags: { type: DataTypes.SMALLINT.UNSIGNED, allowNull: false, defaultValue: 0 },
				note: { type: DataTypes.STRING(500), allowNull: true }
			},
			{ sequelize, tableName: 'readings', timestamps: false }
		);
	}
}
