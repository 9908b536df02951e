import { describe, expect, it } from 'vitest';
import { csvCell, csvLine } from '../../../src/lib/server/research/csv';

describe('CSV cells of research exports (OWASP "CSV injection" guidance)', () => {
	it('puts an apostrophe before text that a spreadsheet would run as a formula', () => {
		expect(csvCell('=HYPERLINK("http://x")')).toBe(`"'=HYPERLINK(""http://x"")"`);
		expect(csvCell('+1')).toBe("'+1");
		expect(csvCell('-2+3')).toBe("'-2+3");
		expect(csvCell('@SUM(A1)')).toBe("'@SUM(A1)");
		expect(csvCell('\tcmd')).toBe(`"'\tcmd"`);
	});

	it('leaves numbers, including negative deviations, as numbers', () => {
		expect(csvCell(-3.5)).toBe('-3.5');
		expect(csvCell(45)).toBe('45');
		expect(csvCell(Number.NaN)).toBe('');
		expect(csvCell(null)).toBe('');
	});

	it('quotes commas, quotes and line breaks (RFC 4180) and ends lines with CRLF', () => {
		expect(csvLine(['a,b', 'say "hi"', 'two\nlines', true])).toBe(
			'"a,b","say ""hi""","two\nlines",true\r\n'
		);
	});
});
