import {
	enRequirement,
	type ExposureClass,
	type StructuralClass
} from '$lib/analysis/requirements/en1992';
import { EXPOSURE_CLASSES_EN } from '$lib/intake/schemas';

const STRUCTURAL_CLASSES = ['S1', 'S2', 'S3', 'S4', 'S5', 'S6'];

/**
 * The member form's suggestion of c_min and c_nom from EN 1992-1-1 §4.4.1 (Table 4.4N, through
 * the engine), structural class S4 unless given; the user may overwrite it or state a project
 * value. Null when the exposure class is not one of EN 206's.
 */
export function suggestEnCover(
	exposureClass: string,
	barDiameterMm: number,
	structuralClass = 'S4'
) {
	if (!(EXPOSURE_CLASSES_EN as readonly string[]).includes(exposureClass)) return null;
	if (!STRUCTURAL_CLASSES.includes(structuralClass)) return null;
	const requirement = enRequirement({
		exposureClass: exposureClass as ExposureClass,
		structuralClass: structuralClass as StructuralClass,
		barDiameterMm
	});
	return {
		cMinMm: requirement.cMinMm,
		cNomMm: requirement.cNomMm,
		deltaCDevMm: requirement.deltaCDevMm,
		basis: requirement.basis
	};
}
