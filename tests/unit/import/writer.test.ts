import { describe, expect, it } from 'vitest';
import { ChunkText, tsvLine, tsvLineOf } from '$lib/server/import/writer';

const reading = {
	memberId: 7,
	xMm: 12.5,
	yMm: null,
	coverMm: 0.1 + 0.2,
	barDiameterMm: 16,
	barSpacingMm: null,
	barDirection: 'top\tlayer',
	note: 'C:\\site\nnote\r\0end'
};

describe('LOAD DATA chunk lines', () => {
	// MariaDB LOAD DATA INFILE defaults: FIELDS ESCAPED BY '\\', NULL written as \N, and the
	// escapes \t \n \r \0 \\ (MariaDB Knowledge Base, "LOAD DATA INFILE").
	it('writes NULL as \\N and escapes tab, newline, carriage return, NUL and backslash', () => {
		expect(tsvLine(reading)).toBe(
			'7\t0.30000000000000004\t12.5\t\\N\t16\t\\N\ttop\\tlayer\tC:\\\\site\\nnote\\r\\0end\n'
		);
	});

	it('writes each length as the shortest text that reads back as the same double', () => {
		const line = tsvLine({ ...reading, coverMm: 25.4 * 1.1, barDirection: null, note: null });
		const cover = line.split('\t')[1];
		expect(Number(cover)).toBe(25.4 * 1.1);
		expect(line.endsWith('\\N\t\\N\n')).toBe(true);
	});

	it('holds only the columns the file fills, in the order the LOAD DATA lists them', () => {
		expect(tsvLineOf(['xMm', 'yMm'])(reading)).toBe('7\t0.30000000000000004\t12.5\t\\N\n');
		expect(tsvLineOf(['yMm', 'xMm'])(reading)).toBe('7\t0.30000000000000004\t\\N\t12.5\n');
		expect(tsvLineOf([])(reading)).toBe('7\t0.30000000000000004\n');
		expect(tsvLineOf(['note'])(reading)).toBe(
			'7\t0.30000000000000004\tC:\\\\site\\nnote\\r\\0end\n'
		);
	});
});

describe('a chunk file’s bytes', () => {
	it('are the UTF-8 of the lines in order, across joins, growth and takes', () => {
		// Lines with 1-, 2-, 3- and 4-byte UTF-8 characters, enough to pass the join size many
		// times and to grow the 1 MB buffer.
		const lines = Array.from(
			{ length: 60_000 },
			(_, i) => `${i}\t${i % 3 === 0 ? 'béton' : i % 3 === 1 ? 'カバー' : 'ok 🧱'}\n`
		);
		const chunk = new ChunkText();
		for (const line of lines.slice(0, 40_000)) chunk.append(line);
		expect(chunk.rows).toBe(40_000);
		const first = chunk.take();
		expect(first.equals(Buffer.from(lines.slice(0, 40_000).join(''), 'utf8'))).toBe(true);
		expect(chunk.rows).toBe(0);
		for (const line of lines.slice(40_000)) chunk.append(line);
		expect(chunk.take().toString('utf8')).toBe(lines.slice(40_000).join(''));
		expect(chunk.take().length).toBe(0);
	});
});
