import { crc32, deflateRawSync } from 'node:zlib';

export interface ZipEntry {
	name: string;
	data: Buffer;
	/** The uncompressed size the headers declare, when it should lie (a hidden zip bomb). */
	declaredSize?: number;
}

/**
 * A minimal zip writer (deflate, no zip64) for test fixtures that no spreadsheet program would
 * write: a zip bomb, a workbook without worksheets. Format: PKWARE APPNOTE 6.3.x, §4.3.
 */
export function buildZip(entries: ZipEntry[]): Buffer {
	const locals: Buffer[] = [];
	const centrals: Buffer[] = [];
	let offset = 0;
	for (const entry of entries) {
		const name = Buffer.from(entry.name);
		const packed = deflateRawSync(entry.data, { level: 9 });
		const crc = crc32(entry.data);
		const local = Buffer.alloc(30);
		local.writeUInt32LE(0x04034b50, 0);
		local.writeUInt16LE(20, 4);
		local.writeUInt16LE(8, 8);
		local.writeUInt32LE(crc, 14);
		local.writeUInt32LE(packed.length, 18);
		local.writeUInt32LE(entry.declaredSize ?? entry.data.length, 22);
		local.writeUInt16LE(name.length, 26);
		locals.push(local, name, packed);
		const central = Buffer.alloc(46);
		central.writeUInt32LE(0x02014b50, 0);
		central.writeUInt16LE(20, 4);
		central.writeUInt16LE(20, 6);
		central.writeUInt16LE(8, 10);
		central.writeUInt32LE(crc, 16);
		central.writeUInt32LE(packed.length, 20);
		central.writeUInt32LE(entry.declaredSize ?? entry.data.length, 24);
		central.writeUInt16LE(name.length, 28);
		central.writeUInt32LE(offset, 42);
		centrals.push(central, name);
		offset += 30 + name.length + packed.length;
	}
	const directory = Buffer.concat(centrals);
	const end = Buffer.alloc(22);
	end.writeUInt32LE(0x06054b50, 0);
	end.writeUInt16LE(entries.length, 8);
	end.writeUInt16LE(entries.length, 10);
	end.writeUInt32LE(directory.length, 12);
	end.writeUInt32LE(offset, 16);
	return Buffer.concat([...locals, directory, end]);
}
