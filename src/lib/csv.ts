/**
 * CSV for every download of the app (RFC 4180 quoting), with cells guarded against formula
 * injection: a spreadsheet runs a cell that starts with =, +, -, @, a tab or a carriage return
 * as a formula (OWASP "CSV Injection"), so such text gets a leading apostrophe and is shown as
 * text — even text that looks like a number ("-2+3" is a formula; telling the harmless ones
 * apart is how guards get holes). Values typed as numbers are written as numbers: a negative
 * deviation such as -3.5 is data. Shared by the browser (the population table's download) and
 * the server (research exports, rejected import rows).
 */

/** Text a spreadsheet would take as a formula; for papaparse's `escapeFormulae` too. */
export const FORMULA_START = /^[=+\-@\t\r]/;

export type CsvValue = string | number | boolean | null | undefined;

export function csvCell(value: CsvValue): string {
	if (value === null || value === undefined) return '';
	if (typeof value === 'number') return Number.isFinite(value) ? String(value) : '';
	if (typeof value === 'boolean') return value ? 'true' : 'false';
	const guarded = FORMULA_START.test(value) ? `'${value}` : value;
	return /[",\r\n]/.test(guarded) ? `"${guarded.replaceAll('"', '""')}"` : guarded;
}

/** One record, CRLF-terminated as RFC 4180 asks. */
export function csvLine(values: readonly CsvValue[]): string {
	return values.map(csvCell).join(',') + '\r\n';
}
