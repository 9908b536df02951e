/**
 * Units: millimetres inside the engine; inches accepted and shown at the edges.
 */

/** Millimetres in an inch, exact by definition (international yard and pound agreement, 1959). */
export const MM_PER_INCH = 25.4;

/** @example inchToMm(1.5) // 38.1 */
export function inchToMm(inches: number): number {
	return inches * MM_PER_INCH;
}

/** @example mmToInch(50.8) // 2 */
export function mmToInch(mm: number): number {
	return mm / MM_PER_INCH;
}

/** Convert readings given in inches to a new array in mm. Cost O(n). */
export function coversFromInches(coversIn: readonly number[] | Float64Array): Float64Array {
	const out = new Float64Array(coversIn.length);
	for (let i = 0; i < out.length; i++) out[i] = coversIn[i] * MM_PER_INCH;
	return out;
}

export type LengthUnit = 'mm' | 'in';

/**
 * Format a cover held in mm for display: mm to 1 decimal, inches to 2 (defaults).
 * @example formatCover(38.1, 'in') // '1.50 in'
 */
export function formatCover(
	valueMm: number | null,
	unit: LengthUnit = 'mm',
	decimals?: number
): string {
	if (valueMm === null || !Number.isFinite(valueMm)) return '–';
	if (unit === 'in') return `${mmToInch(valueMm).toFixed(decimals ?? 2)} in`;
	return `${valueMm.toFixed(decimals ?? 1)} mm`;
}
