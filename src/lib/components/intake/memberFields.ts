import type { FieldSpec } from '$lib/components/form/fieldSpec';
import { DESIGN_CODE_OPTIONS, MEMBER_FACE_OPTIONS, MEMBER_TYPE_OPTIONS } from '$lib/intake/options';

/** A new member's values before anything is typed: structural class S4 is EN 1992-1-1's default. */
export const MEMBER_DEFAULTS: Record<string, string> = {
	memberType: 'slab',
	face: 'top',
	exposureClass: 'XC3',
	structuralClass: 'S4',
	barDiameterMm: '16',
	deltaCDevMm: '10'
};

/**
 * Every field of `memberSchema` in the order the form shows them: what the member is, what its
 * cover is derived from (EN 1992-1-1 §4.4.1), the specified cover from the code's table or the
 * project's specification, then tolerances and geometry.
 */
export const MEMBER_FIELDS: FieldSpec[] = [
	{ name: 'label', label: 'Label', required: true },
	{ name: 'memberType', label: 'Member type', options: MEMBER_TYPE_OPTIONS },
	{ name: 'face', label: 'Face surveyed', options: MEMBER_FACE_OPTIONS },
	{
		name: 'exposureClass',
		label: 'Exposure class',
		hint: 'EN 206: XC3, XD1, XS2…',
		required: true
	},
	{ name: 'structuralClass', label: 'Structural class', hint: 'S1–S6; S4 unless stated' },
	{ name: 'barDiameterMm', label: 'Bar diameter (mm)', numeric: true },
	{ name: 'requirementSource', label: 'Requirement from', options: DESIGN_CODE_OPTIONS },
	{ name: 'cMinMm', label: 'c_min (mm)', numeric: true, required: true },
	{ name: 'cNomMm', label: 'c_nom (mm)', numeric: true, required: true },
	{ name: 'deltaCDevMm', label: 'Δc_dev (mm)', numeric: true, required: true },
	{ name: 'deltaPlusMm', label: 'Δplus (mm)', numeric: true, hint: 'Upper limit: c_nom + Δplus' },
	{ name: 'barSpacingMm', label: 'Bar spacing (mm)', numeric: true },
	{ name: 'spacingToleranceMm', label: 'Spacing tolerance (mm)', numeric: true },
	{ name: 'memberDepthMm', label: 'Member depth (mm)', numeric: true },
	{ name: 'gridWidthMm', label: 'Grid width (mm)', numeric: true, hint: 'Extent of the x, y grid' },
	{ name: 'gridHeightMm', label: 'Grid height (mm)', numeric: true },
	{ name: 'notes', label: 'Notes', multiline: true }
];
