import { DataTypes, literal, QueryTypes, type Sequelize } from 'sequelize';
import { reference, tableOptions } from './columns';
import type { Migration } from './types';

/**
 * Readings become cheap to write and populations cheap to read (docs/performance.md, Import
 * and Pages). Measured with LOAD DATA of a million readings on this layout's predecessor: each
 * secondary index on readings cost 2.5–4.5 s and the import batch's foreign key about 1 s, so:
 * - readings are stored clustered by member: primary key (member_id, id), and no secondary
 *   index at all (one B-tree to write per reading). The id is still unique and increasing, from
 *   the sequence reading_ids (InnoDB lets an AUTO_INCREMENT column only lead an index);
 * - a member's covers also live, sorted, in one member_cover_sets row kept in step by every
 *   write (src/lib/server/readings/coverSets.ts), which the population pages read;
 * - readings.import_batch_id keeps its value but loses its index and foreign key: a batch
 *   records the range of reading ids it wrote (first/last_reading_id), which undo reads within
 *   the survey's members, and a trigger refuses to delete a batch whose readings remain.
 */

const FIND_BATCH_FOREIGN_KEY = `SELECT CONSTRAINT_NAME AS name FROM information_schema.KEY_COLUMN_USAGE
 WHERE TABLE_SCHEMA = DATABASE() AND TABLE_NAME = 'readings' AND COLUMN_NAME = 'import_batch_id'
   AND REFERENCED_TABLE_NAME = 'import_batches'`;

const KEEP_BATCH_READINGS = `CREATE TRIGGER import_batches_keep_readings BEFORE DELETE ON import_batches FOR EACH ROW
 BEGIN
   IF OLD.first_reading_id IS NOT NULL AND EXISTS (
       SELECT 1 FROM members m JOIN readings r ON r.member_id = m.id
        WHERE m.survey_id = OLD.survey_id AND r.id BETWEEN OLD.first_reading_id AND OLD.last_reading_id
          AND r.import_batch_id = OLD.id) THEN
     SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = 'an import batch whose readings remain cannot be deleted; undo it first';
   END IF;
 END`;

const raw = { type: QueryTypes.RAW };

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

async function nextReadingId(sequelize: Sequelize): Promise<number> {
	const [row] = await sequelize.query<{ id: number | null }>('SELECT MAX(id) AS id FROM readings', {
		type: QueryTypes.SELECT
	});
	return Number(row?.id ?? 0) + 1;
}

/**
 * Whether the server replicates through Galera (wsrep on): its sequences need INCREMENT BY 0.
 * SHOW VARIABLES, since a server built without wsrep has no such variable to SELECT.
 */
async function isGaleraNode(sequelize: Sequelize): Promise<boolean> {
	const rows = await sequelize.query<{ Value: string }>("SHOW VARIABLES LIKE 'wsrep_on'", {
		type: QueryTypes.SELECT
	});
	return rows[0]?.Value === 'ON';
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
		// CACHE: ids are handed out from memory, a thousand at a time, in increasing order.
		// On a Galera node the increment must be 0 (MariaDB refuses CACHE with any other under
		// wsrep, MDEV-30388): each node then steps by auto_increment_increment from its own
		// offset, which wsrep_auto_increment_control sets from the cluster's size, so two nodes
		// never hand out one id and each node's ids still rise. A standalone server gets 1, as before.
		const increment = (await isGaleraNode(sequelize)) ? 0 : 1;
		await sequelize.query(
			`CREATE SEQUENCE reading_ids START WITH ${await nextReadingId(sequelize)} INCREMENT BY ${increment} CACHE 1000`,
			raw
		);
		const [foreignKey] = await sequelize.query<{ name: string }>(FIND_BATCH_FOREIGN_KEY, {
			type: QueryTypes.SELECT
		});
		if (foreignKey)
			await sequelize.query(`ALTER TABLE readings DROP FOREIGN KEY \`${foreignKey.name}\``, raw);
		// One rebuild of the table: the member's foreign key moves onto the new primary key.
		await sequelize.query(
			`ALTER TABLE readings
			   MODIFY id BIGINT UNSIGNED NOT NULL DEFAULT (NEXT VALUE FOR reading_ids),
			   DROP PRIMARY KEY, ADD PRIMARY KEY (member_id, id),
			   DROP INDEX readings_member_cover, DROP INDEX readings_import_batch_id`,
			raw
		);
		await fillCoverSets(sequelize);
		await sequelize.query(KEEP_BATCH_READINGS, raw);
	},
	async down({ context: qi }) {
		const sequelize = qi.sequelize;
		await sequelize.query('DROP TRIGGER IF EXISTS import_batches_keep_readings', raw);
		// The foreign key comes back, so readings of a batch deleted meanwhile lose the link first.
		await sequelize.query(
			`UPDATE readings r LEFT JOIN import_batches b ON b.id = r.import_batch_id
			    SET r.import_batch_id = NULL WHERE r.import_batch_id IS NOT NULL AND b.id IS NULL`,
			{ type: QueryTypes.UPDATE }
		);
		await sequelize.query(
			`ALTER TABLE readings
			   DROP PRIMARY KEY, ADD PRIMARY KEY (id),
			   MODIFY id BIGINT UNSIGNED NOT NULL AUTO_INCREMENT,
			   ADD INDEX readings_member_cover (member_id, cover_mm),
			   ADD INDEX readings_import_batch_id (import_batch_id),
			   ADD CONSTRAINT readings_import_batch_fk FOREIGN KEY (import_batch_id)
			     REFERENCES import_batches (id) ON DELETE SET NULL ON UPDATE CASCADE`,
			raw
		);
		await sequelize.query('DROP SEQUENCE IF EXISTS reading_ids', raw);
		await qi.removeColumn('import_batches', 'last_reading_id');
		await qi.removeColumn('import_batches', 'first_reading_id');
		await qi.dropTable('member_cover_sets');
	}
};

/**
 * The stored form of sorted covers as this migration wrote it: IEEE 754 doubles, little-endian,
 * 8 bytes each. Copied from readings/coverSetCodec.ts rather than imported, so that a later
 * change to live code cannot change what this migration does.
 */
function encodeCovers(sortedCoversMm: Float64Array): Buffer {
	const bytes = Buffer.alloc(sortedCoversMm.length * 8);
	for (let i = 0; i < sortedCoversMm.length; i++) bytes.writeDoubleLE(sortedCoversMm[i], i * 8);
	return bytes;
}
