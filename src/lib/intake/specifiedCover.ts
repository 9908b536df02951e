/**
 * A member's specified cover values checked against each other, by EN 1992-1-1 §4.4.1:
 * c_nom = c_min + Δc_dev (Eq. 4.1). A specification may ask for more nominal cover than that (a
 * project rounding up, or adding for a finish), never less: a c_nom below c_min + Δc_dev leaves
 * no allowance for the deviation that every fixing has, and one below c_min is a contradiction.
 */
export interface SpecifiedCover {
	cMinMm: number;
	cNomMm: number;
	deltaCDevMm: number | null;
}

/**
 * Values are typed to 0.1 mm, and inch specifications converted to mm carry more digits
 * (ACI 117's 3/8 in is 9.525 mm): a shortfall under half of 0.1 mm is rounding, not a fault.
 */
const ROUNDING_MM = 0.05;

const shown = (mm: number) => String(Math.round(mm * 10) / 10);

/**
 * What is wrong with the c_nom of `cover`, in words naming the values, or null when it holds.
 * @example cNomProblem({ cMinMm: 35, cNomMm: 40, deltaCDevMm: 10 })
 * // 'c_nom 40 mm is below c_min + Δc_dev = 45 mm (EN 1992-1-1 (4.1)).'
 */
export function cNomProblem({ cMinMm, cNomMm, deltaCDevMm }: SpecifiedCover): string | null {
	if (cNomMm < cMinMm - ROUNDING_MM) {
		return `c_nom ${shown(cNomMm)} mm is below c_min ${shown(cMinMm)} mm: the nominal cover cannot be less than the minimum (EN 1992-1-1 4.4.1).`;
	}
	if (deltaCDevMm == null) return null;
	const expectedMm = cMinMm + deltaCDevMm;
	if (cNomMm < expectedMm - ROUNDING_MM) {
		return `c_nom ${shown(cNomMm)} mm is below c_min + Δc_dev = ${shown(expectedMm)} mm (EN 1992-1-1 (4.1)).`;
	}
	return null;
}
