/**
 * CSV writing for research exports (RFC 4180 quoting), with cells guarded against formula
 * injection: a spreadsheet runs a cell that starts with =, +, -, @ (or a tab or carriage return
 * before one) as a formula, so such text cells get a leading apostrophe. Numbers are written as
 * numbers — a negative deviation such as -3.5 is data, not a formula, and stays as it is.
 */
const FORMULA_START = /^[=+\-@\t\r]/;

export function csvCell(value: string | number | boolean | null | undefined): string {
	if (value === null || value === undefined) return '';
	if (typeof value === 'number') return Number.isFinite(value) ? String(value) : '';
	if (typeof value === 'boolean') return value ? 'true' : 'false';
	const guarded = FORMULA_START.test(value) ? `'${value}` : value;
	return /[",\r\n]/.test(guarded) ? `"${guarded.replaceAll('"', '""')}"` : guarded;
}

export function csvLine(values: readonly (string | number | boolean | null | undefined)[]): string {
	return values.map(csvCell).join(',') + '\r\n';
}
