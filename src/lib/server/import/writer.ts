import type { Connection } from 'mariadb';
import type { Transaction } from 'sequelize';
import type { ValidReading } from './validateRow';

const INSERT_READINGS =
	'INSERT INTO readings (member_id, import_batch_id, x_mm, y_mm, cover_mm, bar_diameter_mm, ' +
	'bar_spacing_mm, bar_direction, flags, note) VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?)';

/**
 * The connector connection a Sequelize transaction runs on, so bulk inserts can use the
 * mariadb connector's batch() (≈ 5× Sequelize's bulkCreate, STACK.md) inside that transaction.
 */
export function connectionOf(transaction: Transaction): Connection {
	const connection = (transaction as unknown as { connection?: Connection }).connection;
	if (!connection) throw new Error('the transaction has no connection yet');
	return connection;
}

/**
 * Lengths go as decimal text (the shortest exact form of the double, so the server parses the
 * same value back): the connector's bulk protocol sends one parameter type per packet and starts
 * a new packet whenever a number switches between integer and fractional (30 vs 30.5), which
 * cut the insert rate about fivefold on real covers.
 */
const asText = (mm: number | null) => (mm === null ? null : String(mm));

export function readingParams(r: ValidReading, batchId: number, flags: number): unknown[] {
	return [
		r.memberId,
		batchId,
		asText(r.xMm),
		asText(r.yMm),
		asText(r.coverMm),
		asText(r.barDiameterMm),
		asText(r.barSpacingMm),
		r.barDirection,
		flags,
		r.note
	];
}

/** Inserts rows of readingParams() in one round trip (MariaDB's bulk protocol). */
export async function insertReadings(connection: Connection, rows: unknown[][]): Promise<void> {
	if (rows.length === 0) return;
	await connection.batch(INSERT_READINGS, rows);
}
