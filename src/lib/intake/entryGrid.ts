/** The entry grid's columns and its checks as you type (the server checks again, with zod). */
export const COLUMNS = [
	{ key: 'x', label: 'x (mm)', numeric: true },
	{ key: 'y', label: 'y (mm)', numeric: true },
	{ key: 'cover', label: 'Cover (mm)', numeric: true },
	{ key: 'diameter', label: 'Bar ⌀ (mm)', numeric: true },
	{ key: 'direction', label: 'Direction/layer', numeric: false },
	{ key: 'note', label: 'Note', numeric: false }
] as const;
export type ColumnKey = (typeof COLUMNS)[number]['key'];
export type GridRow = Record<ColumnKey, string>;

export const emptyRow = (): GridRow => ({
	x: '',
	y: '',
	cover: '',
	diameter: '',
	direction: '',
	note: ''
});
export const isEmpty = (row: GridRow) => Object.values(row).every((v) => v.trim() === '');

/** What is wrong with one cell, in words, or null. */
export function cellProblem(key: ColumnKey, value: string, coverMaxMm = 300): string | null {
	const text = value.trim();
	const column = COLUMNS.find((c) => c.key === key)!;
	if (key === 'cover' && text === '') return 'cover is required';
	if (!column.numeric || text === '') return null;
	if (!/^[+-]?(\d+(\.\d*)?|\.\d+)$/.test(text))
		return `${column.label} is not a number (use “.” for decimals)`;
	const number = Number(text);
	if (key === 'cover' && number < 0) return 'cover is negative';
	if (key === 'cover' && number > coverMaxMm) return `cover is above ${coverMaxMm} mm`;
	return null;
}

/** Rows pasted from a spreadsheet: tab-separated cells, one row a line. */
export function pastedRows(text: string, startColumn: number): string[][] {
	return text
		.replace(/\r/g, '')
		.split('\n')
		.filter((line) => line.trim() !== '')
		.map((line) => [...Array(startColumn).fill(undefined), ...line.split('\t')]);
}
