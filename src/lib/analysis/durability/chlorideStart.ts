/**
 * Starting values for the chloride profile fit, from the linearised profile: with Cs guessed,
 * erfc⁻¹((C − Ci)/(Cs − Ci)) = x/(2√(Da·t)) is a line through the origin in x, whose slope b
 * gives Da = 1/(4b²t). Good starting values keep the least-squares search short and away
 * from the flat regions of erfc.
 */

/**
 * erfc⁻¹(q) to about 2e-3 relative, enough for a starting value: S. Winitzki's closed-form
 * approximation of erf⁻¹ with a = 0.147 ("A handy approximation for the error function and its
 * inverse", 2008; constant from memory). Ours because jstat's erfcinv iterates (≈ 3 µs a value,
 * a fifth of a whole fit).
 */
function roughErfcInverse(q: number): number {
	const x = 1 - q;
	const a = 0.147;
	const ln = Math.log(1 - x * x);
	const b = 2 / (Math.PI * a) + ln / 2;
	return Math.sign(x) * Math.sqrt(Math.sqrt(b * b - ln / a) - b);
}

/**
 * Cs₀ = Ci + 1.1·(max C − Ci); Da₀ from the least-squares slope of erfc⁻¹ ratios on depth.
 * Falls back to Da₀ = x̄²/t when no ratio is usable. Units as the fit. Cost O(n).
 * @example chlorideStartingValues(x, y, 0.05, 25) // { surfaceContent, dMm2PerYear }
 */
export function chlorideStartingValues(
	depthsMm: Float64Array,
	contents: Float64Array,
	initialContent: number,
	ageYears: number
): { surfaceContent: number; dMm2PerYear: number } {
	let highest = -Infinity;
	for (const c of contents) highest = Math.max(highest, c);
	const surfaceContent = initialContent + 1.1 * (highest - initialContent);
	let sxz = 0;
	let sxx = 0;
	for (let i = 0; i < depthsMm.length; i++) {
		const ratio = (contents[i] - initialContent) / (surfaceContent - initialContent);
		if (!(ratio > 0.001 && ratio < 0.999)) continue;
		sxz += depthsMm[i] * roughErfcInverse(ratio);
		sxx += depthsMm[i] * depthsMm[i];
	}
	const slope = sxx > 0 ? sxz / sxx : 0;
	if (slope > 0) return { surfaceContent, dMm2PerYear: 1 / (4 * slope * slope * ageYears) };
	const meanDepth = depthsMm.reduce((s, x) => s + x, 0) / depthsMm.length;
	return { surfaceContent, dMm2PerYear: Math.max(meanDepth * meanDepth, 1) / ageYears };
}
