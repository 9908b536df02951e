/**
 * Starting values for the chloride profile fit, from the linearised profile: with Cs guessed,
 * erfc⁻¹((C − Ci)/(Cs − Ci)) = x/(2√(Da·t)) is a line through the origin in x, whose slope b
 * gives Da = 1/(4b²t). Good starting values keep the least-squares search short and away
 * from the flat regions of erfc.
 */
import { erfcInverse } from '../normalDistribution';

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
	const surfaceContent = initialContent + 1.1 * (Math.max(...contents) - initialContent);
	let sxz = 0;
	let sxx = 0;
	for (let i = 0; i < depthsMm.length; i++) {
		const ratio = (contents[i] - initialContent) / (surfaceContent - initialContent);
		if (!(ratio > 0.001 && ratio < 0.999)) continue;
		sxz += depthsMm[i] * erfcInverse(ratio);
		sxx += depthsMm[i] * depthsMm[i];
	}
	const slope = sxx > 0 ? sxz / sxx : 0;
	if (slope > 0) return { surfaceContent, dMm2PerYear: 1 / (4 * slope * slope * ageYears) };
	const meanDepth = depthsMm.reduce((s, x) => s + x, 0) / depthsMm.length;
	return { surfaceContent, dMm2PerYear: Math.max(meanDepth * meanDepth, 1) / ageYears };
}
