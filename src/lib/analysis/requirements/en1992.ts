/**
 * EN 1992-1-1:2004 (+AC:2010) §4.4.1, recommended values (a National Annex may change them).
 * Table cells are from memory of the standard's recommended values; the tests quote them.
 */
import { type CoverRequirement, DEFAULT_ALLOWED_FRACTION_BELOW, roundMm } from './requirement';

export type StructuralClass = 'S1' | 'S2' | 'S3' | 'S4' | 'S5' | 'S6';
export type ExposureClass =
	'X0' | 'XC1' | 'XC2' | 'XC3' | 'XC4' | 'XD1' | 'XD2' | 'XD3' | 'XS1' | 'XS2' | 'XS3';

const CLASSES: StructuralClass[] = ['S1', 'S2', 'S3', 'S4', 'S5', 'S6'];
/** Column of Table 4.4N: X0 | XC1 | XC2/XC3 | XC4 | XD1/XS1 | XD2/XS2 | XD3/XS3. */
const COLUMN_4_4N: Record<ExposureClass, number> = {
	X0: 0,
	XC1: 1,
	XC2: 2,
	XC3: 2,
	XC4: 3,
	XD1: 4,
	XS1: 4,
	XD2: 5,
	XS2: 5,
	XD3: 6,
	XS3: 6
};
/** EN 1992-1-1 Table 4.4N, c_min,dur (mm), rows S1…S6. */
const TABLE_4_4N: readonly (readonly number[])[] = [
	[10, 10, 10, 15, 20, 25, 30],
	[10, 10, 15, 20, 25, 30, 35],
	[10, 10, 20, 25, 30, 35, 40],
	[10, 15, 25, 30, 35, 40, 45],
	[15, 20, 30, 35, 40, 45, 50],
	[20, 25, 35, 40, 45, 50, 55]
];
/** Table 4.3N, row "Strength class": f_ck (MPa) at or above which the class may drop by 1. */
const STRENGTH_FOR_REDUCTION: Record<ExposureClass, number> = {
	X0: 30,
	XC1: 30,
	XC2: 35,
	XC3: 35,
	XC4: 40,
	XD1: 40,
	XD2: 40,
	XS1: 40,
	XD3: 45,
	XS2: 45,
	XS3: 45
};

/**
 * c_min,dur from EN 1992-1-1 Table 4.4N (mm).
 * @example cMinDurMm('S4', 'XC3') // 25
 */
export function cMinDurMm(structuralClass: StructuralClass, exposureClass: ExposureClass): number {
	return TABLE_4_4N[CLASSES.indexOf(structuralClass)][COLUMN_4_4N[exposureClass]];
}

export interface StructuralClassInput {
	exposureClass: ExposureClass;
	/** Design working life of 100 years: class + 2. */
	designLife100Years?: boolean;
	/** Characteristic cylinder strength f_ck (MPa), e.g. 35 for C35/45. */
	fckMpa?: number;
	/** Member with slab geometry (bar position not affected by construction): class − 1. */
	slabGeometry?: boolean;
	/** Special quality control of the concrete production ensured: class − 1. */
	specialQualityControl?: boolean;
}

/**
 * Structural class by EN 1992-1-1 Table 4.3N: S4 for 50 years, +2 for 100 years, −1 each for
 * strength at or above the table's class, slab geometry and special quality control; min S1.
 * @example structuralClassEn({ exposureClass: 'XC3', fckMpa: 35 }) // 'S3'
 */
export function structuralClassEn(input: StructuralClassInput): StructuralClass {
	let index = 3 + (input.designLife100Years ? 2 : 0);
	if (input.fckMpa !== undefined && input.fckMpa >= STRENGTH_FOR_REDUCTION[input.exposureClass]) {
		index -= 1;
	}
	if (input.slabGeometry) index -= 1;
	if (input.specialQualityControl) index -= 1;
	return CLASSES[Math.min(5, Math.max(0, index))];
}

export interface EnRequirementInput extends StructuralClassInput {
	/** Override the class Table 4.3N gives. */
	structuralClass?: StructuralClass;
	/** Bar diameter φ (mm), or φ_n of a bundle: c_min,b = φ (Table 4.2). */
	barDiameterMm: number;
	/** Nominal maximum aggregate size over 32 mm: c_min,b + 5 mm (Table 4.2). */
	aggregateOver32Mm?: boolean;
	/** Δc_dev (mm): 10 recommended; 5–10 with quality assurance; 0–10 with accurate measurement and rejection (4.4.1.3). */
	deltaCDevMm?: number;
	deltaPlusMm?: number | null;
	allowedFractionBelow?: number;
}

/**
 * Requirement from EN 1992-1-1 §4.4.1: c_min = max(c_min,b; c_min,dur; 10 mm) (Eq. 4.2, the
 * Δc_dur additions at their recommended 0), c_nom = c_min + Δc_dev (Eq. 4.1). Units mm.
 * @example enRequirement({ exposureClass: 'XC3', barDiameterMm: 16 }).cNomMm // 35
 */
export function enRequirement(input: EnRequirementInput): CoverRequirement {
	const deltaCDevMm = input.deltaCDevMm ?? 10;
	if (!(deltaCDevMm >= 0 && deltaCDevMm <= 10))
		throw new Error('EN 1992-1-1 needs 0 ≤ Δc_dev ≤ 10 mm');
	const structuralClass = input.structuralClass ?? structuralClassEn(input);
	const cMinBMm = input.barDiameterMm + (input.aggregateOver32Mm ? 5 : 0);
	const cDurMm = cMinDurMm(structuralClass, input.exposureClass);
	const cMinMm = Math.max(cMinBMm, cDurMm, 10);
	return {
		cMinMm,
		cNomMm: roundMm(cMinMm + deltaCDevMm),
		deltaCDevMm,
		deltaPlusMm: input.deltaPlusMm ?? null,
		allowedFractionBelow: input.allowedFractionBelow ?? DEFAULT_ALLOWED_FRACTION_BELOW,
		codeSystem: 'EN',
		basis:
			`EN 1992-1-1 4.4.1: ${structuralClass}, ${input.exposureClass}, c_min,b ${cMinBMm} mm, ` +
			`c_min,dur ${cDurMm} mm (Table 4.4N), Δc_dev ${deltaCDevMm} mm`
	};
}
