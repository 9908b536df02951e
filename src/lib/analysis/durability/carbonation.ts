/**
 * Carbonation by the square-root-of-time law x = k·√t (Tuutti 1982; fib Bulletin 34 (2006)
 * uses the same √t form with its k split into factors). Units: x mm, t years, k mm/√year.
 */

/**
 * Carbonation depth x = k·√t (mm). @example carbonationDepthMm(4, 25) // 20
 */
export function carbonationDepthMm(kMmPerSqrtYear: number, ageYears: number): number {
	if (!(kMmPerSqrtYear >= 0 && Number.isFinite(kMmPerSqrtYear)))
		throw new Error(`carbonation needs a finite k ≥ 0 mm/√year, not ${kMmPerSqrtYear}`);
	if (!(ageYears >= 0 && Number.isFinite(ageYears)))
		throw new Error(`carbonation needs an age t ≥ 0 years, not ${ageYears}`);
	return kMmPerSqrtYear * Math.sqrt(ageYears);
}

/**
 * Carbonation coefficient from a measured depth at a known age: k = x/√t (mm/√year).
 * @example carbonationRateFromDepth(10, 16) // 2.5
 */
export function carbonationRateFromDepth(depthMm: number, ageYears: number): number {
	if (!(depthMm >= 0 && ageYears > 0))
		throw new Error('carbonation rate needs depth ≥ 0 and age > 0');
	return depthMm / Math.sqrt(ageYears);
}

/**
 * Years until the carbonation front reaches the bar (depassivation when x ≥ cover):
 * t = (cover/k)². Never (null) when k = 0; a negative or non-finite k or cover is refused (not
 * read as "never"). @example carbonationTimeToDepassivationYears(30, 2.5) // 144
 */
export function carbonationTimeToDepassivationYears(
	coverMm: number,
	kMmPerSqrtYear: number
): number | null {
	if (!(kMmPerSqrtYear >= 0 && Number.isFinite(kMmPerSqrtYear)))
		throw new Error(`carbonation needs a finite k ≥ 0 mm/√year, not ${kMmPerSqrtYear}`);
	if (!(coverMm >= 0 && Number.isFinite(coverMm)))
		throw new Error(`carbonation needs a cover ≥ 0 mm, not ${coverMm}`);
	if (kMmPerSqrtYear === 0) return null;
	const r = coverMm / kMmPerSqrtYear;
	return r * r;
}
