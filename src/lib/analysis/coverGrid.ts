/**
 * The grid a cover meter logs on: every reading is a whole number k of steps, and the stored
 * millimetres are exactly the double that (k / den) · factor gives — k / den for metric steps
 * (1, 0.5, 0.1, 0.05, 0.01 mm …), (k / den) · 25.4 for inch steps, which is how the import turns
 * a decimal inch figure into mm. A division by a whole den is correctly rounded, the same double
 * as parsing the decimal text, so the grid reproduces each stored reading to the bit; a grid is
 * only taken when it does so for every value (checked, not assumed).
 */

export interface CoverGrid {
	/** Steps per unit: 1, 2, 10, 20, 100 … */
	den: number;
	/** Millimetres per unit: 1 (mm) or 25.4 (inch, exact by definition). */
	factor: number;
}

/** Step sizes tried, coarsest first (common practice: meters log 1, 0.5 or 0.1 mm; inch meters 0.1, 0.05 or 0.01 in). */
export const COVER_GRIDS: readonly CoverGrid[] = [
	{ den: 10, factor: 25.4 },
	{ den: 1, factor: 1 },
	{ den: 20, factor: 25.4 },
	{ den: 2, factor: 1 },
	{ den: 100, factor: 25.4 },
	{ den: 10, factor: 1 },
	{ den: 20, factor: 1 },
	{ den: 1000, factor: 25.4 },
	{ den: 100, factor: 1 },
	{ den: 10000, factor: 25.4 },
	{ den: 1000, factor: 1 },
	{ den: 10000, factor: 1 }
];

/** Largest step count stored (a signed 32-bit integer). */
const MAX_STEPS = 2 ** 31 - 1;

/** The reading, in mm, of k steps of the grid. */
export function gridValue(k: number, grid: CoverGrid): number {
	return grid.factor === 1 ? k / grid.den : (k / grid.den) * grid.factor;
}

/** k for a value on the grid, or null when the grid does not reproduce the value exactly. */
export function gridSteps(valueMm: number, grid: CoverGrid): number | null {
	const k = Math.round((valueMm / grid.factor) * grid.den);
	if (!(Math.abs(k) <= MAX_STEPS)) return null;
	return gridValue(k, grid) === valueMm ? k : null;
}

/**
 * The coarsest grid that reproduces every value exactly, or null when none does (values from
 * a calculation rather than a meter). Cost O(values × grids tried).
 * @example detectGrid(Float64Array.of(40.1, 41, 43.7)) // { den: 10, factor: 1 }
 */
export function detectGrid(values: Float64Array): CoverGrid | null {
	for (const grid of COVER_GRIDS) {
		let fits = true;
		for (let i = 0; i < values.length && fits; i++) fits = gridSteps(values[i], grid) !== null;
		if (fits) return grid;
	}
	return null;
}

/** The grid's step in mm, for people: 0.1 mm, 1.27 mm (0.05 in). */
export function gridStepMm(grid: CoverGrid): number {
	return grid.factor / grid.den;
}
