/**
 * The cover requirement a population is judged against, as plain data.
 */

export type CodeSystem = 'EN' | 'ACI' | 'project';

/**
 * Default share of the population allowed below c_min: 5 %, the same fractile as the
 * characteristic value (EN 1990 Annex D uses the 5 % fractile for characteristic values;
 * common practice for cover). A project may set its own, e.g. 10 % in the RILEM example.
 */
export const DEFAULT_ALLOWED_FRACTION_BELOW = 0.05;

/**
 * A length sum or difference rounded to 1e-6 mm, far below any meter's resolution: in binary
 * floating point 45.3 − 10.1 is 35.199999999999996, and a reading of exactly 35.2 mm would
 * then count as below c_min.
 * @example roundMm(45.3 - 10.1) // 35.2
 */
export function roundMm(valueMm: number): number {
	return Math.round(valueMm * 1e6) / 1e6;
}

export interface CoverRequirement {
	/** Minimum cover c_min (mm): EN 1992-1-1 4.4.1.2; for ACI the specified cover less ACI 117's tolerance. */
	cMinMm: number;
	/** Nominal / specified cover c_nom (mm). */
	cNomMm: number;
	/** Allowance for deviation Δc_dev (mm); for ACI the minus tolerance of ACI 117. */
	deltaCDevMm: number;
	/** Upper tolerance Δplus (mm) when the project limits excess cover; null when not limited. */
	deltaPlusMm?: number | null;
	/** Share allowed below c_min (default DEFAULT_ALLOWED_FRACTION_BELOW). */
	allowedFractionBelow?: number;
	codeSystem: CodeSystem;
	/** Member depth (mm), for ACI 117's tolerance on cover. */
	memberDepthMm?: number | null;
	/** Where the figures come from, in words (table, clause, project specification). */
	basis?: string;
}

/**
 * A project-specific requirement: c_nom and Δc_dev given, c_min = c_nom − Δc_dev.
 * Units mm. Throws on a negative or non-finite figure.
 * @example projectRequirement(45, 10) // { cMinMm: 35, cNomMm: 45, deltaCDevMm: 10, ... }
 */
export function projectRequirement(
	cNomMm: number,
	deltaCDevMm: number,
	extra: Partial<
		Pick<CoverRequirement, 'deltaPlusMm' | 'allowedFractionBelow' | 'memberDepthMm'>
	> = {}
): CoverRequirement {
	if (!(cNomMm > 0 && deltaCDevMm >= 0 && deltaCDevMm < cNomMm)) {
		throw new Error('projectRequirement needs c_nom > Δc_dev ≥ 0 mm');
	}
	return {
		cMinMm: roundMm(cNomMm - deltaCDevMm),
		cNomMm,
		deltaCDevMm,
		deltaPlusMm: extra.deltaPlusMm ?? null,
		allowedFractionBelow: extra.allowedFractionBelow ?? DEFAULT_ALLOWED_FRACTION_BELOW,
		codeSystem: 'project',
		memberDepthMm: extra.memberDepthMm ?? null,
		basis: 'project specification'
	};
}

/** The allowed fraction of a requirement, with the documented default. */
export function allowedFractionOf(requirement: CoverRequirement): number {
	return requirement.allowedFractionBelow ?? DEFAULT_ALLOWED_FRACTION_BELOW;
}
