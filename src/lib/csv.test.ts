import { describe, expect, it } from 'vitest';
import { csvCell, csvLine, FORMULA_START } from './csv';

// OWASP "CSV Injection": cells starting with = + - @ tab CR are run as formulas.
describe('csvCell guards formulas', () => {
	it.each([
		['=1+1', "'=1+1"],
		['+cmd', "'+cmd"],
		["-2+3+cmd|' /C calc'!A0", "'-2+3+cmd|' /C calc'!A0"],
		['@SUM(A1)', "'@SUM(A1)"],
		['\t=1', "'\t=1"],
		['\r=1', `"'\r=1"`],
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
