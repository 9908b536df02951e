/**
 * CSV for every download of the app (RFC 4180 quoting), with cells guarded against formula
 * injection: a spreadsheet runs a cell that starts with =, +, -, @, a tab or a carriage return
 * as a formula (OWASP "CSV Injection"), so such text gets a leading apostrophe and is shown as
 * text — even text that looks like a number ("-2+3" is a formula; telling the harmless ones
 * apart is how guards get holes). The same holds for each piece of a field that a spreadsheet
 * reading with another list separator (";" in much of Europe, or a tab) would take as a cell of
 * its own: "x;=1+1" is written "x;'=1+1", quoted. Values typed as numbers are written as numbers: a negative
 * deviation such as -3.5 is data. Shared by the browser (the population table's download) and
 * the server (research exports, rejected import rows).
 */

/** Text a spreadsheet would take as a formula (leading blanks and quotes are skipped by some). */
export const FORMULA_START = /^[\s"]*[=+\-@]|^[\t\r]/;

/**
 * A formula sign at the start of a piece that a spreadsheet could see as a cell of its own: after
 * a separator of any locale (a spreadsheet whose list separator is ";" or a tab splits a field
 * we wrote with ","), or after a line break (a reader that ignores the quotes starts a new row).
 */
const FORMULA_AFTER_BREAK = /([,;\t\r\n][\s"]*)(?=[=+\-@])/g;

/** Quoted when a reader at any usual separator would otherwise split or misread the field. */
const NEEDS_QUOTES = /[",;\t\r\n]/;

export type CsvValue = string | number | boolean | null | undefined;

export function csvCell(value: CsvValue): string {
	if (value === null || value === undefined) return '';
	if (typeof value === 'number') return Number.isFinite(value) ? String(value) : '';
	if (typeof value === 'boolean') return value ? 'true' : 'false';
	const inner = value.replace(FORMULA_AFTER_BREAK, "$1'");
	const guarded = FORMULA_START.test(inner) ? `'${inner}` : inner;
	return NEEDS_QUOTES.test(guarded) ? `"${guarded.replaceAll('"', '""')}"` : guarded;
}

/** One record, CRLF-terminated as RFC 4180 asks. */
export function csvLine(values: readonly CsvValue[]): string {
	return values.map(csvCell).join(',') + '\r\n';
}
