import { z } from 'zod';
import { DESIGN_CODES, MEMBER_FACES, MEMBER_TYPES, SURVEY_STATES } from '$lib/words';

/**
 * Shapes of the API's read answers for an organisation's own (or shared) records. The routes
 * build their answers to these and the OpenAPI document is generated from them.
 */
/** How the OpenAPI document describes a path id; routes parse one with pathId (web/params.ts). */
export const idParam = (name: string) =>
	z.coerce.number().int().min(1).max(4_294_967_295).describe(`Id of the ${name}.`);

export const errorBodySchema = z
	.object({
		error: z.object({
			code: z.string().describe('Stable machine-readable code, e.g. invalid_input, not_found.'),
			message: z.string().describe('What went wrong, in words.'),
			field: z.string().optional().describe('The input field at fault, for invalid_input.'),
			errorId: z.string().optional().describe('Quote it to support for a server error.')
		})
	})
	.meta({ id: 'Error' });

export const assetSchema = z
	.object({
		id: z.number().int(),
		name: z.string(),
		locationText: z.string().nullable(),
		yearOfConstruction: z.number().int().nullable(),
		designCode: z.enum(DESIGN_CODES),
		unitSystem: z.enum(['mm', 'inch']),
		designServiceLifeYears: z.number().int(),
		researchOptIn: z.boolean(),
		access: z.enum(['owner', 'shared']).describe('Owned by your organisation, or shared with it.')
	})
	.meta({ id: 'Asset' });

export const surveySchema = z
	.object({
		id: z.number().int(),
		assetId: z.number().int(),
		title: z.string(),
		surveyDate: z.string().describe('YYYY-MM-DD'),
		status: z.enum(SURVEY_STATES)
	})
	.meta({ id: 'Survey' });

const mmOrNull = z.number().nullable();

export const memberSchema = z
	.object({
		id: z.number().int(),
		surveyId: z.number().int(),
		label: z.string(),
		memberType: z.enum(MEMBER_TYPES),
		face: z.enum(MEMBER_FACES),
		exposureClass: z.string(),
		requirementSource: z.enum(DESIGN_CODES),
		cMinMm: z.number(),
		cNomMm: z.number(),
		deltaCDevMm: z.number(),
		deltaPlusMm: mmOrNull,
		barDiameterMm: mmOrNull,
		readingCount: z.number().int()
	})
	.meta({ id: 'Member' });

export const readingSchema = z
	.object({
		id: z.number().int(),
		xMm: mmOrNull,
		yMm: mmOrNull,
		coverMm: z.number(),
		barDiameterMm: mmOrNull,
		barSpacingMm: mmOrNull,
		barDirection: z.string().nullable(),
		flags: z.number().int().describe('Bit flags: 1 manual, 2 doubtful, 4 out of range.'),
		note: z.string().nullable()
	})
	.meta({ id: 'Reading' });

export const nextCursorSchema = z
	.string()
	.nullable()
	.describe('Send as `cursor` for the next page; null on the last page.');

export const assetListSchema = z.object({ assets: z.array(assetSchema) });
export const surveyListSchema = z.object({ surveys: z.array(surveySchema) });
export const memberListSchema = z.object({ members: z.array(memberSchema) });
export const readingPageSchema = z.object({
	readings: z.array(readingSchema),
	nextCursor: nextCursorSchema
});
