import {
	DataTypes,
	Model,
	type CreationOptional,
	type InferAttributes,
	type InferCreationAttributes,
	type Sequelize
} from 'sequelize';

/**
 * A member's summary row: its reading count and the count of each distinct cover (migrations
 * 009, 012, 017, 018; the table keeps its first name). Written only through
 * src/lib/server/readings/coverSets.ts, which keeps it in step with the readings.
 */
export class MemberCoverSet extends Model<
	InferAttributes<MemberCoverSet>,
	InferCreationAttributes<MemberCoverSet>
> {
	declare memberId: number;
	declare readingCount: number;
	/** The meter's grid, cover = (k / gridDen) · gridFactor (analysis/coverGrid.ts); null off every grid. */
	declare gridDen: CreationOptional<number | null>;
	declare gridFactor: CreationOptional<number | null>;
	declare distinctCovers: CreationOptional<number>;
	/** Counts of each distinct cover (readings/coverCountCodec.ts; migrations 012 and 017); null until written. */
	declare coverCounts: CreationOptional<Buffer | null>;
	declare updatedAt: CreationOptional<Date>;

	static initModel(sequelize: Sequelize) {
		MemberCoverSet.init(
			{
				memberId: { type: DataTypes.INTEGER.UNSIGNED, primaryKey: true },
				readingCount: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
				gridDen: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
				gridFactor: { type: DataTypes.DOUBLE, allowNull: true },
				distinctCovers: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 },
				coverCounts: { type: DataTypes.BLOB('long'), allowNull: true },
				updatedAt: DataTypes.DATE
			},
			{ sequelize, tableName: 'member_cover_sets', createdAt: false }
		);
	}
}
