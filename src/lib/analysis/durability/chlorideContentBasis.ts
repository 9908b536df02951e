/**
 * Chloride content by mass of binder from content by mass of concrete.
 *
 * Laboratories report chloride as % by mass of the (dry) concrete sample; thresholds and the
 * fib/EN 206 limits are in % by mass of binder (cement). With m_Cl the chloride in one cubic
 * metre: %binder = m_Cl/binder = (%concrete·ρ_concrete)/binder. Both the binder content and the
 * concrete's density are stated by the caller (a mix design, or an assumption said as such);
 * they are not defaults because the ratio moves the result by its whole size (about 6 to 8 for
 * 300–400 kg/m³ binder in 2 400 kg/m³ concrete — common practice).
 */

/**
 * Convert % by mass of concrete to % by mass of binder.
 * Units: binder and density in kg/m³; contents in % by mass. Cost O(1).
 * @example chloridePercentOfBinder(0.05, 350, 2400) // 0.342857… (0.05 × 2400 / 350)
 */
export function chloridePercentOfBinder(
	percentOfConcrete: number,
	binderKgPerM3: number,
	concreteDensityKgPerM3: number
): number {
	if (!(Number.isFinite(percentOfConcrete) && percentOfConcrete >= 0))
		throw new Error('chloride content must be a number ≥ 0 (% by mass of concrete)');
	if (!(binderKgPerM3 > 0 && Number.isFinite(binderKgPerM3)))
		throw new Error('binder content must be a number > 0 (kg/m³)');
	if (!(concreteDensityKgPerM3 > binderKgPerM3 && Number.isFinite(concreteDensityKgPerM3)))
		throw new Error('concrete density must be a number (kg/m³) above the binder content');
	return (percentOfConcrete * concreteDensityKgPerM3) / binderKgPerM3;
}
