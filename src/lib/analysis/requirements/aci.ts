/**
 * ACI 318-19 Table 20.5.1.3.1 (specified cover, cast-in-place nonprestressed members) and
 * ACI 117-10 §2.2.4 (tolerance on cover). Cells from memory of the published tables.
 */
import { inchToMm } from '../units';
import { type CoverRequirement, DEFAULT_ALLOWED_FRACTION_BELOW, roundMm } from './requirement';

export type AciExposure = 'cast-against-ground' | 'weather-or-ground' | 'not-exposed';
export type AciMember = 'slab-joist-wall' | 'beam-column-pedestal-tie';
/** Bar designations of ASTM A615 (inch-pound), No. 3 to No. 18. */
export type AciBarSize = 3 | 4 | 5 | 6 | 7 | 8 | 9 | 10 | 11 | 14 | 18;

/**
 * Specified cover (in) by ACI 318-19 Table 20.5.1.3.1.
 * @example aciSpecifiedCoverIn('weather-or-ground', 'beam-column-pedestal-tie', 5) // 1.5
 */
export function aciSpecifiedCoverIn(
	exposure: AciExposure,
	member: AciMember,
	barSize: AciBarSize
): number {
	if (exposure === 'cast-against-ground') return 3;
	if (exposure === 'weather-or-ground') return barSize >= 6 ? 2 : 1.5;
	if (member === 'beam-column-pedestal-tie') return 1.5;
	return barSize >= 14 ? 1.5 : 0.75;
}

/**
 * Minus tolerance on cover by ACI 117-10: 3/8 in for members up to 12 in deep, 1/2 in deeper,
 * and never more than one third of the specified cover. Units mm in and out.
 * @example aciCoverToleranceMm(inchToMm(1.5), inchToMm(10)) // 9.525 (3/8 in)
 */
export function aciCoverToleranceMm(specifiedCoverMm: number, memberDepthMm: number): number {
	const byDepthMm = memberDepthMm <= inchToMm(12) ? inchToMm(3 / 8) : inchToMm(1 / 2);
	return Math.min(byDepthMm, specifiedCoverMm / 3);
}

export interface AciRequirementInput {
	exposure: AciExposure;
	member: AciMember;
	barSize: AciBarSize;
	memberDepthMm: number;
	deltaPlusMm?: number | null;
	allowedFractionBelow?: number;
}

/**
 * Requirement from ACI 318-19 and ACI 117: c_nom = specified cover, Δc_dev = ACI 117 tolerance,
 * c_min = c_nom − Δc_dev. Units mm.
 * @example aciRequirement({ exposure: 'weather-or-ground', member: 'slab-joist-wall', barSize: 5, memberDepthMm: 200 }).cMinMm // 28.575
 */
export function aciRequirement(input: AciRequirementInput): CoverRequirement {
	const specifiedIn = aciSpecifiedCoverIn(input.exposure, input.member, input.barSize);
	const cNomMm = inchToMm(specifiedIn);
	const toleranceMm = aciCoverToleranceMm(cNomMm, input.memberDepthMm);
	return {
		cMinMm: roundMm(cNomMm - toleranceMm),
		cNomMm,
		deltaCDevMm: toleranceMm,
		deltaPlusMm: input.deltaPlusMm ?? null,
		allowedFractionBelow: input.allowedFractionBelow ?? DEFAULT_ALLOWED_FRACTION_BELOW,
		codeSystem: 'ACI',
		memberDepthMm: input.memberDepthMm,
		basis:
			`ACI 318-19 Table 20.5.1.3.1: ${specifiedIn} in specified cover (No. ${input.barSize}); ` +
			`ACI 117 tolerance ${(toleranceMm / 25.4).toFixed(3)} in`
	};
}
