import { z } from 'zod';
import { DESIGN_CODES, MEMBER_FACES, MEMBER_TYPES } from '$lib/words';

/**
 * What a research reading is, field by field: the one definition behind the CSV and JSON Lines
 * columns, the API's answers, the data dictionary (JSON Schema) and the OpenAPI document.
 * Nothing here names an asset, a place, an organisation, a person, or carries a free-text note.
 */
const mm = (what: string) => z.number().describe(`${what}, in mm.`);
const mmOrNull = (what: string) =>
	z.number().nullable().describe(`${what}, in mm; null if not recorded.`);

export const pseudonymSchema = (prefix: 'A' | 'M') =>
	z
		.string()
		.regex(new RegExp(`^${prefix}-[0-9a-f]{16}$`))
		.describe(
			`Pseudonymous ${prefix === 'A' ? 'asset' : 'member'} identifier: a keyed hash (HMAC-SHA256 with a server secret) of the record's id. Stable across exports; not reversible.`
		);

export const researchMemberSchema = z
	.object({
		memberRef: pseudonymSchema('M'),
		assetRef: pseudonymSchema('A'),
		memberType: z.enum(MEMBER_TYPES).describe('Kind of member.'),
		face: z.enum(MEMBER_FACES).describe('Face of the member that was scanned.'),
		exposureClass: z.string().describe('EN 206 exposure class or ACI 318 exposure category.'),
		designCode: z.enum(DESIGN_CODES).describe('Design code of the structure.'),
		requirementSource: z.enum(DESIGN_CODES).describe('Where the specified cover comes from.'),
		constructionDecade: z
			.number()
			.int()
			.nullable()
			.describe('Decade of construction (first year, e.g. 1990 for 1990–1999); null if unknown.'),
		cMinMm: mm('Specified minimum cover c_min'),
		cNomMm: mm('Specified nominal cover c_nom'),
		deltaCDevMm: mm('Allowance for deviation Δc_dev'),
		barDiameterSpecifiedMm: mmOrNull('Specified bar diameter'),
		memberDepthMm: mmOrNull('Member depth'),
		gridWidthMm: mmOrNull('Width of the member grid the positions are measured on'),
		gridHeightMm: mmOrNull('Height of the member grid')
	})
	.meta({ title: 'ResearchMember', description: 'One surveyed member, anonymised.' });
export type ResearchMember = z.infer<typeof researchMemberSchema>;

export const researchReadingSchema = z
	.object({
		memberRef: pseudonymSchema('M'),
		assetRef: pseudonymSchema('A'),
		memberType: z.enum(MEMBER_TYPES).describe('Kind of member.'),
		face: z.enum(MEMBER_FACES).describe('Face scanned.'),
		exposureClass: z.string().describe('Exposure class of the member.'),
		designCode: z.enum(DESIGN_CODES).describe('Design code of the structure.'),
		constructionDecade: z.number().int().nullable().describe('Decade of construction.'),
		cMinMm: mm('Specified minimum cover c_min'),
		cNomMm: mm('Specified nominal cover c_nom'),
		xMm: mmOrNull("Position along the member's grid, from the member's own origin"),
		yMm: mmOrNull("Position across the member's grid, from the member's own origin"),
		coverMm: mm('Measured cover'),
		deviationMm: mm('Measured cover minus c_nom (negative: less cover than specified)'),
		barDiameterMm: mmOrNull("The meter's estimate of the bar diameter"),
		barSpacingMm: mmOrNull('Measured bar spacing'),
		doubtful: z.boolean().describe('The surveyor marked the reading as doubtful.'),
		manual: z.boolean().describe('Entered by hand rather than imported from the meter file.')
	})
	.meta({ title: 'ResearchReading', description: 'One cover reading, anonymised.' });
export type ResearchReading = z.infer<typeof researchReadingSchema>;

/** Column order of the readings CSV: the schema's own field order. */
export const READING_COLUMNS = Object.keys(
	researchReadingSchema.shape
) as (keyof ResearchReading)[];
