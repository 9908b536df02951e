/**
 * Input checks and the one sort every assessment starts from.
 */

/** Throw the house error "<name> needs at least N readings" when there are too few. */
export function requireReadings(name: string, count: number, minimum: number): void {
	if (count < minimum) {
		throw new Error(`${name} needs at least ${minimum} readings`);
	}
}

/**
 * A sample size for a factor or bound: a whole number ≥ minimum (a fractional n has no
 * Student or noncentral t behind it); Infinity only where the caller allows the limit.
 */
export function requireSampleSize(
	name: string,
	n: number,
	minimum: number,
	allowInfinite = false
): void {
	if (allowInfinite && n === Infinity) return;
	if (!Number.isInteger(n)) throw new Error(`${name} needs a whole number of readings, not ${n}`);
	requireReadings(name, n, minimum);
}

/** A probability, fractile or confidence strictly between 0 and 1; NaN is refused too. */
export function requireOpenUnit(name: string, what: string, value: number): void {
	if (!(value > 0 && value < 1)) throw new Error(`${name} needs 0 < ${what} < 1, not ${value}`);
}

/**
 * Check one value as given: a finite number (and, for a cover, 0 mm or more). An empty string,
 * null or undefined would otherwise become 0 mm in a Float64Array and pass as a real reading.
 */
function checkReading(value: unknown, index: number, signed: boolean): void {
	if (typeof value !== 'number' || !Number.isFinite(value)) {
		const shown = value === '' ? 'empty' : value === null ? 'null' : String(value);
		throw new Error(`reading ${index + 1} is not a finite number (${shown})`);
	}
	if (!signed && value < 0)
		throw new Error(`reading ${index + 1} is negative (${value} mm): cover is ≥ 0 mm`);
}

function toSorted(values: readonly number[] | Float64Array, signed: boolean): Float64Array {
	// A typed array holds only numbers; a plain array may hold '' or null, which would become 0.
	if (!(values instanceof Float64Array)) {
		for (let i = 0; i < values.length; i++) checkReading(values[i], i, signed);
	}
	const sorted = Float64Array.from(values);
	let ascending = true;
	for (let i = 0; i < sorted.length; i++) {
		const value = sorted[i];
		if (!((signed || value >= 0) && Number.isFinite(value))) checkReading(value, i, signed);
		if (i > 0 && value < sorted[i - 1]) ascending = false;
	}
	return ascending ? sorted : sorted.sort();
}

/**
 * Signed values (mm) sorted as toSortedCovers sorts covers — deviations from c_nom or margins
 * over c_min may be below 0 — with the same refusal of non-numbers.
 * @example toSortedValues([5, -2, 0]) // Float64Array [-2, 0, 5]
 */
export function toSortedValues(valuesMm: readonly number[] | Float64Array): Float64Array {
	return toSorted(valuesMm, true);
}

/**
 * Copy readings into a new Float64Array sorted ascending (numeric sort, no comparator).
 *
 * Definition: the order statistics x(1) ≤ … ≤ x(n) of the readings. Units are kept (mm).
 * Cost: O(n log n) once, O(n) when the readings come already in order; every later step takes
 * the sorted array
 * and does not sort again. The caller's array is never changed. Throws, naming the reading,
 * on one that is not a finite number (an empty string or null is not read as 0 mm) or is
 * negative.
 * @example toSortedCovers([50, 40, 45]) // Float64Array [40, 45, 50]
 */
export function toSortedCovers(coversMm: readonly number[] | Float64Array): Float64Array {
	return toSorted(coversMm, false);
}

/**
 * Number of sorted values strictly below `limit` (binary search).
 *
 * Cost O(log n). Used for "fraction below c_min": a reading equal to c_min complies.
 * @example countBelowSorted(Float64Array.of(40, 45, 50), 45) // 1
 */
export function countBelowSorted(sorted: Float64Array, limit: number): number {
	let lo = 0;
	let hi = sorted.length;
	while (lo < hi) {
		const mid = (lo + hi) >>> 1;
		if (sorted[mid] < limit) lo = mid + 1;
		else hi = mid;
	}
	return lo;
}

/**
 * Number of sorted values at or below `limit` (binary search), i.e. n·ECDF(limit).
 * @example countAtOrBelowSorted(Float64Array.of(40, 45, 50), 45) // 2
 */
export function countAtOrBelowSorted(sorted: Float64Array, limit: number): number {
	let lo = 0;
	let hi = sorted.length;
	while (lo < hi) {
		const mid = (lo + hi) >>> 1;
		if (sorted[mid] <= limit) lo = mid + 1;
		else hi = mid;
	}
	return lo;
}

/** A finite number, or null: results must survive JSON (no NaN, no Infinity). */
export function finiteOrNull(value: number): number | null {
	return Number.isFinite(value) ? value : null;
}
