import { QueryTypes, type QueryInterface } from 'sequelize';
import type { Migration } from './types';

/**
 * Grid cover counts rewritten from fixed entries (int32 step, uint32 count: 8 bytes, migration
 * 012) to variable-length ones (ZigZag first step, then the gap to the previous step less one,
 * and the count, as unsigned LEB128 varints: about 2 bytes an entry; readings/coverCountCodec.ts
 * says why). Off-grid counts (float64 cover, uint32 count) are unchanged. Both forms are written
 * out here rather than imported, because a migration must still mean what it meant when the live
 * codec changes again. A row's bytes are rewritten in place, a page of members at a time, each
 * page in its own transaction; `down` writes the fixed form back.
 */

type Entry = [step: number, count: number];

function fixedEntries(bytes: Buffer): Entry[] {
	if (bytes.length % 8 !== 0)
		throw new Error(`counts of ${bytes.length} bytes are not 8-byte entries`);
	const out: Entry[] = [];
	for (let at = 0; at < bytes.length; at += 8)
		out.push([bytes.readInt32LE(at), bytes.readUInt32LE(at + 4)]);
	return out;
}

function fixedBytes(entries: Entry[]): Buffer {
	const bytes = Buffer.alloc(entries.length * 8);
	entries.forEach(([step, count], i) => {
		bytes.writeInt32LE(step, i * 8);
		bytes.writeUInt32LE(count, i * 8 + 4);
	});
	return bytes;
}

function varintBytes(entries: Entry[]): Buffer {
	const out: number[] = [];
	const put = (value: number) => {
		let v = value;
		while (v >= 128) {
			out.push((v % 128) + 128);
			v = Math.floor(v / 128);
		}
		out.push(v);
	};
	entries.forEach(([step, count], i) => {
		put(i === 0 ? (step >= 0 ? 2 * step : -2 * step - 1) : step - entries[i - 1][0] - 1);
		put(count);
	});
	return Buffer.from(out);
}

function varintEntries(bytes: Buffer): Entry[] {
	const numbers: number[] = [];
	let value = 0;
	let scale = 1;
	for (const b of bytes) {
		value += (b & 127) * scale;
		scale *= 128;
		if (b < 128) {
			numbers.push(value);
			value = 0;
			scale = 1;
		}
	}
	if (scale !== 1 || numbers.length % 2 !== 0) throw new Error('counts end inside an entry');
	const out: Entry[] = [];
	for (let i = 0; i < numbers.length; i += 2) {
		const z = numbers[i];
		const step = i === 0 ? (z % 2 === 0 ? z / 2 : -(z + 1) / 2) : out[i / 2 - 1][0] + z + 1;
		out.push([step, numbers[i + 1]]);
	}
	return out;
}

const PAGE = 1000;

async function rewrite(qi: QueryInterface, convert: (bytes: Buffer) => Buffer): Promise<void> {
	const sequelize = qi.sequelize;
	let after = 0;
	for (;;) {
		const done = await sequelize.transaction(async (transaction) => {
			const rows = await sequelize.query<{ memberId: number; counts: Buffer }>(
				`SELECT member_id AS memberId, cover_counts AS counts FROM member_cover_sets
				  WHERE member_id > :after AND grid_den IS NOT NULL AND cover_counts IS NOT NULL
				  ORDER BY member_id LIMIT ${PAGE} FOR UPDATE`,
				{ type: QueryTypes.SELECT, replacements: { after }, transaction }
			);
			for (const row of rows)
				await sequelize.query('UPDATE member_cover_sets SET cover_counts = ? WHERE member_id = ?', {
					replacements: [convert(Buffer.from(row.counts)), row.memberId],
					transaction
				});
			if (rows.length > 0) after = rows[rows.length - 1].memberId;
			return rows.length < PAGE;
		});
		if (done) return;
	}
}

export const shorterCoverCounts: Migration = {
	name: '017-shorter-cover-counts',
	async up({ context: qi }) {
		await rewrite(qi, (bytes) => varintBytes(fixedEntries(bytes)));
	},
	async down({ context: qi }) {
		await rewrite(qi, (bytes) => fixedBytes(varintEntries(bytes)));
	}
};
