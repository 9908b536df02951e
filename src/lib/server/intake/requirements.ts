import {
	enRequirement,
	type ExposureClass,
	type StructuralClass
} from '$lib/analysis/requirements/en1992';
import { EXPOSURE_CLASSES_EN } from '$lib/words';

const STRUCTURAL_CLASSES = ['S1', 'S2', 'S3', 'S4', 'S5', 'S6'];

/** EN 1992-1-1 4.4.1.3: Δc_dev is 10 mm recommended, down to 0 with measured, rejected cover. */
export const EN_DELTA_C_DEV_RANGE_MM = { min: 0, max: 10 } as const;

/**
 * The member form's suggestion of c_min and c_nom from EN 1992-1-1 §4.4.1 (Table 4.4N, through
 * the engine), structural class S4 unless given, and c_nom = c_min + Δc_dev (Eq. 4.1) with the
 * Δc_dev the user typed, 10 mm when none; the user may overwrite it or state a project value.
 * Null when the exposure class is not one of EN 206's or Δc_dev is outside EN's range.
 */
export function suggestEnCover(
	exposureClass: string,
	barDiameterMm: number,
	structuralClass = 'S4',
	deltaCDevMm?: number
) {
	if (!(EXPOSURE_CLASSES_EN as readonly string[]).includes(exposureClass)) return null;
	if (!STRUCTURAL_CLASSES.includes(structuralClass)) return null;
	const { min, max } = EN_DELTA_C_DEV_RANGE_MM;
	if (deltaCDevMm !== undefined && !(deltaCDevMm >= min && deltaCDevMm <= max)) return null;
	const requirement = enRequirement({
		exposureClass: exposureClass as ExposureClass,
		structuralClass: structuralClass as StructuralClass,
		barDiameterMm,
		deltaCDevMm
	});
	return {
		cMinMm: requirement.cMinMm,
		cNomMm: requirement.cNomMm,
		deltaCDevMm: requirement.deltaCDevMm,
		basis: requirement.basis
	};
}
