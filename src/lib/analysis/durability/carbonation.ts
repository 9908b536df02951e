/**
 * Carbonation by the square-root-of-time law x = k·√t (Tuutti 1982; fib Bulletin 34 (2006)
 * uses the same √t form with its k split into factors). Units: x mm, t years, k mm/√year.
 */

/**
 * Carbonation depth x = k·√t (mm). @example carbonationDepthMm(4, 25) // 20
 */
export function carbonationDepthMm(kMmPerSqrtYear: number, ageYears: number): number {
	if (!(kMmPerSqrtYear >= 0 && ageYears >= 0)) throw new Error('carbonation needs k ≥ 0 and t ≥ 0');
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
 * t = (cover/k)². Infinite (null) when k = 0. @example carbonationTimeToDepassivationYears(30, 2.5) // 144
 */
export function carbonationTimeToDepassivationYears(
	coverMm: number,
	kMmPerSqrtYear: number
): number | null {
	if (!(kMmPerSqrtYear > 0)) return null;
	const r = Math.max(0, coverMm) / kMmPerSqrtYear;
	return r * r;
}
