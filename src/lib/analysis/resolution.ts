/**
 * The meter's resolution, read from the readings themselves.
 */

/** Steps a cover meter logs in (mm), coarsest first (common practice: 1, 0.5 or 0.1 mm). */
export const METER_STEPS_MM = [1, 0.5, 0.1] as const;

/** Fewest readings from which a step is claimed (fewer could sit on a grid by chance). */
const MIN_READINGS_FOR_STEP = 8;

/** True when every reading is a whole multiple of the step (to 1e-6 of a step, for rounding). */
function onGrid(sorted: Float64Array, stepMm: number): boolean {
	for (let i = 0; i < sorted.length; i++) {
		const k = sorted[i] / stepMm;
		if (Math.abs(k - Math.round(k)) > 1e-6) return false;
	}
	return true;
}

/**
 * The coarsest of 1, 0.5 and 0.1 mm of which every reading is a whole multiple, or null when
 * the readings are finer (or fewer than 8). Cost O(n) a step tried; a meter of 0.1 mm reading
 * ends at the first reading off the coarser grids.
 * @example detectResolutionMm(Float64Array.of(40, 41, 41, 43, 44, 45, 47, 50)) // 1
 */
export function detectResolutionMm(sorted: Float64Array): number | null {
	if (sorted.length < MIN_READINGS_FOR_STEP) return null;
	for (const step of METER_STEPS_MM) if (onGrid(sorted, step)) return step;
	return null;
}

/**
 * detectResolutionMm for a population held as counts: the grid test is per value, so the
 * distinct values answer it; n is the number of readings they stand for.
 */
export function detectResolutionOfDistinctMm(distinct: Float64Array, n: number): number | null {
	if (n < MIN_READINGS_FOR_STEP) return null;
	for (const step of METER_STEPS_MM) if (onGrid(distinct, step)) return step;
	return null;
}
