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
 * Copy readings into a new Float64Array sorted ascending (numeric sort, no comparator).
 *
 * Definition: the order statistics x(1) ≤ … ≤ x(n) of the readings. Units are kept (mm).
 * Cost: O(n log n) once, O(n) when the readings come already in order (the population pages
 * pass members' stored cover sets merged in order); every later step takes the sorted array
 * and does not sort again. The caller's array is never changed. Throws on a reading that is
 * not a finite number.
 * @example toSortedCovers([50, 40, 45]) // Float64Array [40, 45, 50]
 */
export function toSortedCovers(coversMm: readonly number[] | Float64Array): Float64Array {
	const sorted = Float64Array.from(coversMm);
	let ascending = true;
	for (let i = 0; i < sorted.length; i++) {
		if (!Number.isFinite(sorted[i])) {
			throw new Error(`reading ${i + 1} is not a finite number`);
		}
		if (i > 0 && sorted[i] < sorted[i - 1]) ascending = false;
	}
	return ascending ? sorted : sorted.sort();
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
