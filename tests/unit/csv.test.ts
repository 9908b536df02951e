import fc from 'fast-check';
import Papa from 'papaparse';
import { describe, expect, it } from 'vitest';
import { csvCell, csvLine, FORMULA_START } from '$lib/csv';

/** What a spreadsheet would run as a formula once it has split a line into cells. */
const RUNS_AS_FORMULA = /^[\s"]*[=+\-@]/;

// OWASP "CSV Injection": cells starting with = + - @ tab CR are run as formulas.
describe('csvCell guards formulas', () => {
	it.each([
		['=1+1', "'=1+1"],
		['+cmd', "'+cmd"],
		["-2+3+cmd|' /C calc'!A0", "'-2+3+cmd|' /C calc'!A0"],
		['@SUM(A1)', "'@SUM(A1)"],
		['\t=1', `"'\t'=1"`],
		['\r=1', `"'\r'=1"`],
		['-', "'-"]
	])('%j → %j', (text, cell) => {
		expect(csvCell(text)).toBe(cell);
	});

	it.each(['42', 'L2-BAY-01', 'deck · XD3', 'a=b'])('leaves %j as it is', (text) => {
		expect(csvCell(text)).toBe(text);
	});

	it('writes numbers as numbers, even negative ones, and nothing for null and NaN', () => {
		expect(csvLine([-3.5, null, Number.NaN, true, 'a,"b"'])).toBe('-3.5,,,true,"a,""b"""\r\n');
	});

	it('is the same rule as a RegExp for papaparse', () => {
		expect(FORMULA_START.test('=HYPERLINK("x")')).toBe(true);
		// Text that looks like a number is guarded too: only typed numbers pass as they are.
		expect(FORMULA_START.test('-12.5')).toBe(true);
		expect(csvCell(-12.5)).toBe('-12.5');
	});
});

describe('the CSV formula guard holds whatever separator the spreadsheet splits at', () => {
	it('a note "x;=1+1" is quoted and its second piece guarded', () => {
		expect(csvCell('x;=1+1')).toBe(`"x;'=1+1"`);
		expect(csvLine(['D-01', 'x;=1+1'])).toBe(`D-01,"x;'=1+1"\r\n`);
		expect(csvCell('a\tb')).toBe('"a\tb"');
	});

	// Text of the characters that matter (separators, quotes, breaks, formula signs) and any other.
	const risky = fc.string({
		unit: fc.oneof(
			fc.constantFrom(',', ';', '\t', '"', '\r', '\n', '=', '+', '-', '@', ' ', "'", 'x', '1'),
			fc.string({ minLength: 1, maxLength: 1 })
		),
		maxLength: 24
	});

	it('property: read back at "," every field is the text written, behind at most added apostrophes', () => {
		fc.assert(
			fc.property(fc.array(risky, { minLength: 1, maxLength: 6 }), (fields) => {
				const line = csvLine(fields).slice(0, -2);
				// papaparse reads an empty text as no row at all: one empty field is what was written.
				const parsed = line === '' ? [''] : Papa.parse<string[]>(line, { delimiter: ',' }).data[0];
				expect(parsed).toHaveLength(fields.length);
				parsed.forEach((cell, i) => {
					expect(cell.replaceAll("'", '')).toBe(fields[i].replaceAll("'", ''));
					expect(cell).not.toMatch(RUNS_AS_FORMULA);
				});
			}),
			{ seed: 20261204, numRuns: Math.max(2000, 10 * Number(process.env.FUZZ_RUNS ?? 0)) }
		);
	});

	it('property: split at ";", a tab or a line break instead, no piece runs as a formula', () => {
		fc.assert(
			fc.property(
				fc.array(risky, { minLength: 1, maxLength: 6 }),
				fc.constantFrom(';', '\t'),
				(fields, separator) => {
					const text = csvLine(fields);
					const rows = Papa.parse<string[]>(text, { delimiter: separator }).data;
					for (const row of rows) for (const cell of row) expect(cell).not.toMatch(RUNS_AS_FORMULA);
					// A reader that ignores quotes altogether: every piece between separators and breaks.
					for (const piece of text.split(/[,;\t\r\n]/))
						expect(piece.replace(/^"+/, '')).not.toMatch(RUNS_AS_FORMULA);
				}
			),
			{ seed: 20261204, numRuns: Math.max(2000, 10 * Number(process.env.FUZZ_RUNS ?? 0)) }
		);
	});
});

describe('CSV cells as research exports write them (OWASP "CSV injection" guidance)', () => {
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
