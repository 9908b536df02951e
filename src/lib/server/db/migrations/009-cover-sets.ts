import { DataTypes, literal, QueryTypes, type Sequelize } from 'sequelize';
import { encodeCovers } from '../../readings/coverSetCodec';
import { reference, tableOptions } from './columns';
import type { Migration } from './types';

/**
 * Readings become cheap to write and populations cheap to read (docs/performance.md, issues 5
 * and 6). Measured with LOAD DATA of a million readings: each secondary index on readings cost
 * 2.5–4.5 s and the import batch's foreign key about 1 s, so:
 * - the (member_id, cover_mm) index goes: a member's covers now live, sorted, in one
 *   member_cover_sets row kept in step by every write (src/lib/server/readings/coverSets.ts);
 *   a plain (member_id) index stays for the member's foreign key and its cover map;
 * - readings.import_batch_id keeps its value but loses its index and foreign key: a batch
 *   records the range of reading ids it wrote (first/last_reading_id), which is what undo reads,
 *   and a trigger refuses to delete a batch whose readings are still there.
 */

const FIND_BATCH_FOREIGN_KEY = `SELECT CONSTRAINT_NAME AS name FROM information_schema.KEY_COLUMN_USAGE
 WHERE TABLE_SCHEMA = DATABASE() AND TABLE_NAME = 'readings' AND COLUMN_NAME = 'import_batch_id'
   AND REFERENCED_TABLE_NAME = 'import_batches'`;

const KEEP_BATCH_READINGS = `CREATE TRIGGER import_batches_keep_readings BEFORE DELETE ON import_batches FOR EACH ROW
 BEGIN
   IF OLD.first_reading_id IS NOT NULL AND EXISTS (
       SELECT 1 FROM readings
        WHERE id BETWEEN OLD.first_reading_id AND OLD.last_reading_id AND import_batch_id = OLD.id) THEN
     SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = 'an import batch whose readings remain cannot be deleted; undo it first';
   END IF;
 END`;

/** Fills member_cover_sets from the readings already there, a few members at a time. */
async function fillCoverSets(sequelize: Sequelize) {
	const members = await sequelize.query<{ id: number }>(
		'SELECT DISTINCT member_id AS id FROM readings ORDER BY member_id',
		{ type: QueryTypes.SELECT }
	);
	for (let i = 0; i < members.length; i += 50) {
		const part = members.slice(i, i + 50).map((m) => m.id);
		const rows = await sequelize.query<{ memberId: number; coverMm: number }>(
			'SELECT member_id AS memberId, cover_mm AS coverMm FROM readings WHERE member_id IN (:part)',
			{ type: QueryTypes.SELECT, replacements: { part } }
		);
		const lists = new Map<number, number[]>(part.map((id) => [id, []]));
		for (const r of rows) lists.get(r.memberId)!.push(Number(r.coverMm));
		for (const [memberId, list] of lists) {
			const covers = Float64Array.from(list).sort();
			await sequelize.query(
				'INSERT INTO member_cover_sets (member_id, reading_count, covers_mm) VALUES (?, ?, ?)',
				{ type: QueryTypes.INSERT, replacements: [memberId, covers.length, encodeCovers(covers)] }
			);
		}
	}
}

export const coverSets: Migration = {
	name: '009-cover-sets',
	async up({ context: qi }) {
		const sequelize = qi.sequelize;
		await qi.createTable(
			'member_cover_sets',
			{
				member_id: { ...reference('members'), primaryKey: true },
				reading_count: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 },
				// Sorted covers in mm, IEEE 754 doubles little-endian (readings/coverSetCodec.ts).
				covers_mm: { type: DataTypes.BLOB('long'), allowNull: false },
				updated_at: {
					type: DataTypes.DATE(3),
					allowNull: false,
					defaultValue: literal('CURRENT_TIMESTAMP(3)')
				}
			},
			tableOptions
		);
		await qi.addColumn('import_batches', 'first_reading_id', {
			type: DataTypes.BIGINT.UNSIGNED,
			allowNull: true
		});
		await qi.addColumn('import_batches', 'last_reading_id', {
			type: DataTypes.BIGINT.UNSIGNED,
			allowNull: true
		});
		await sequelize.query(
			`UPDATE import_batches b JOIN (
			   SELECT import_batch_id AS batchId, MIN(id) AS lo, MAX(id) AS hi FROM readings
			    WHERE import_batch_id IS NOT NULL GROUP BY import_batch_id) r ON r.batchId = b.id
			    SET b.first_reading_id = r.lo, b.last_reading_id = r.hi`,
			{ type: QueryTypes.UPDATE }
		);
		await qi.addIndex('readings', ['member_id'], { name: 'readings_member' });
		const [foreignKey] = await sequelize.query<{ name: string }>(FIND_BATCH_FOREIGN_KEY, {
			type: QueryTypes.SELECT
		});
		if (foreignKey) await qi.removeConstraint('readings', foreignKey.name);
		await qi.removeIndex('readings', 'readings_import_batch_id');
		await qi.removeIndex('readings', 'readings_member_cover');
		await fillCoverSets(sequelize);
		await sequelize.query(KEEP_BATCH_READINGS, { type: QueryTypes.RAW });
	},
	async down({ context: qi }) {
		const sequelize = qi.sequelize;
		await sequelize.query('DROP TRIGGER IF EXISTS import_batches_keep_readings', {
			type: QueryTypes.RAW
		});
		// The foreign key comes back, so readings of a batch deleted meanwhile lose the link first.
		await sequelize.query(
			`UPDATE readings r LEFT JOIN import_batches b ON b.id = r.import_batch_id
			    SET r.import_batch_id = NULL WHERE r.import_batch_id IS NOT NULL AND b.id IS NULL`,
			{ type: QueryTypes.UPDATE }
		);
		await qi.addIndex('readings', ['import_batch_id'], { name: 'readings_import_batch_id' });
		await qi.addConstraint('readings', {
			type: 'foreign key',
			fields: ['import_batch_id'],
			name: 'readings_import_batch_fk',
			references: { table: 'import_batches', field: 'id' },
			onDelete: 'SET NULL',
			onUpdate: 'CASCADE'
		});
		await qi.addIndex('readings', ['member_id', 'cover_mm'], { name: 'readings_member_cover' });
		await qi.removeIndex('readings', 'readings_member');
		await qi.removeColumn('import_batches', 'last_reading_id');
		await qi.removeColumn('import_batches', 'first_reading_id');
		await qi.dropTable('member_cover_sets');
	}
};
