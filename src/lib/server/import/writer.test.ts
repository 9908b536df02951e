import { describe, expect, it } from 'vitest';
import { tsvLine } from './writer';

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
			'7\t12.5\t\\N\t0.30000000000000004\t16\t\\N\ttop\\tlayer\tC:\\\\site\\nnote\\r\\0end\n'
		);
	});

	it('writes each length as the shortest text that reads back as the same double', () => {
		const line = tsvLine({ ...reading, coverMm: 25.4 * 1.1, barDirection: null, note: null });
		const cover = line.split('\t')[3];
		expect(Number(cover)).toBe(25.4 * 1.1);
		expect(line.endsWith('\\N\t\\N\n')).toBe(true);
	});
});
