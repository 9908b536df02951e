/**
 * Figures and dates as people read them, one way on every page and in the report: lengths in
 * mm, shares in %, counts with their noun, dates in ISO 8601's order. Browser-safe (pages and
 * the server's report use the same functions). A missing value shows as an em dash.
 */

/** What is shown where a figure is missing. */
export const NO_VALUE = '—';

type Maybe = number | null | undefined;
const missing = (value: Maybe): value is null | undefined => value === null || value === undefined;

/** A plain number to `digits` decimals: "0.482". */
export const num = (value: Maybe, digits = 2): string =>
	missing(value) ? NO_VALUE : value.toFixed(digits);

/** A length in millimetres: "31.5 mm". */
export const mm = (value: Maybe, digits = 1): string =>
	missing(value) ? NO_VALUE : `${value.toFixed(digits)} mm`;

/** A share (0–1) as a percentage: "4.2 %". */
export const percent = (share: Maybe, digits = 1): string =>
	missing(share) ? NO_VALUE : `${(share * 100).toFixed(digits)} %`;

/**
 * A projected share with the precision it can bear: one decimal below 10 %, none above
 * ("3.2 %", "45 %"), since the projections behind it are not good to a tenth of a per cent there.
 */
export const roundedPercent = (share: number): string => percent(share, share < 0.1 ? 1 : 0);

/**
 * A count with its noun, as people read it: "1 member", "2 members", "2,242 readings". The one
 * place plurals are made, so no page says "1 members" or "2 row(s)".
 */
export function counted(n: number, one: string, many = `${one}s`): string {
	return `${n.toLocaleString('en-GB')} ${n === 1 ? one : many}`;
}

/**
 * Dates as people read them, one way everywhere: "2026-03-02", and with the time
 * "2026-03-02 14:05 UTC" (unambiguous in every locale, ISO 8601's order). Exports and the API
 * keep full ISO 8601 timestamps; these are for pages and the report only.
 */
export function formatDate(value: Date | string | null | undefined, none = NO_VALUE): string {
	if (value === null || value === undefined || value === '') return none;
	if (typeof value === 'string' && /^\d{4}-\d{2}-\d{2}$/.test(value)) return value;
	const date = new Date(value);
	return Number.isNaN(date.getTime()) ? String(value) : date.toISOString().slice(0, 10);
}

export function formatDateTime(value: Date | string | null | undefined, none = NO_VALUE): string {
	if (value === null || value === undefined || value === '') return none;
	const date = new Date(value);
	if (Number.isNaN(date.getTime())) return String(value);
	return `${date.toISOString().slice(0, 16).replace('T', ' ')} UTC`;
}
