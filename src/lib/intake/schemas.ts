import { z } from 'zod';
import { DESIGN_CODES, MEMBER_FACES, MEMBER_TYPES } from '$lib/words';
import { cNomProblem } from './specifiedCover';

/** Input schemas of the intake forms and API, shared by the server and the browser. */

// Optional fields end in a plain schema (the pipe) and a default rather than a bare transform, so
// that the API document generated from these (src/lib/server/api/openapi) can say what they are:
// optional in a request, string or number or null in the saved record.
export const text = (max: number) => z.string().trim().max(max, `At most ${max} characters.`);
export const optionalText = (max: number) =>
	text(max)
		.transform((v) => v || null)
		.pipe(z.string().nullable())
		.nullable()
		.default(null);
/** A number from a form field or JSON; '' means not given. */
export const optionalNumber = (label: string, min: number, max: number) =>
	z
		.preprocess(
			(v) =>
				v === '' || v == null ? null : typeof v === 'string' ? Number(v.replace(',', '.')) : v,
			z
				.number({ error: `${label} must be a number.` })
				.min(min, `${label} must be at least ${min}.`)
				.max(max, `${label} must be at most ${max}.`)
				.nullable()
		)
		.default(null);
export const requiredNumber = (label: string, min: number, max: number) =>
	z.preprocess(
		(v) =>
			v === '' || v == null ? undefined : typeof v === 'string' ? Number(v.replace(',', '.')) : v,
		z
			.number({ error: `${label} is required and must be a number.` })
			.min(min, `${label} must be at least ${min}.`)
			.max(max, `${label} must be at most ${max}.`)
	);

export const assetSchema = z.object({
	name: text(160).min(1, 'Give the asset a name.'),
	locationText: optionalText(255),
	description: optionalText(5000),
	yearOfConstruction: optionalNumber('Year of construction', 1800, 2100),
	designCode: z.enum(DESIGN_CODES, { error: 'Choose a design code.' }),
	unitSystem: z.enum(['mm', 'inch']).default('mm'),
	designServiceLifeYears: requiredNumber('Design service life', 1, 300)
});
export type AssetInput = z.infer<typeof assetSchema>;

export const surveySchema = z.object({
	title: text(160).min(1, 'Give the survey a title.'),
	surveyDate: z.iso.date({ error: 'Give the survey date as YYYY-MM-DD.' }),
	surveyorName: optionalText(120),
	meterMake: optionalText(120),
	meterSerial: optionalText(80),
	meterCalibration: optionalText(120),
	notes: optionalText(5000)
});
export type SurveyInput = z.infer<typeof surveySchema>;

const memberFieldsSchema = z.object({
	label: text(80).min(1, 'Give the member a label.'),
	memberType: z.enum(MEMBER_TYPES, { error: 'Choose the member type.' }),
	face: z.enum(MEMBER_FACES, { error: 'Choose the face surveyed.' }),
	exposureClass: text(24).min(1, 'Give the exposure class.'),
	requirementSource: z.enum(DESIGN_CODES, { error: 'Choose where the requirement comes from.' }),
	structuralClass: optionalText(4),
	cMinMm: requiredNumber('c_min', 0, 200),
	cNomMm: requiredNumber('c_nom', 0, 300),
	deltaCDevMm: requiredNumber('Δc_dev', 0, 50),
	deltaPlusMm: optionalNumber('Δ plus', 0, 100),
	barDiameterMm: optionalNumber('Bar diameter', 1, 100),
	barSpacingMm: optionalNumber('Bar spacing', 1, 5000),
	spacingToleranceMm: optionalNumber('Spacing tolerance', 0, 500),
	memberDepthMm: optionalNumber('Member depth', 1, 10000),
	gridWidthMm: optionalNumber('Grid width', 1, 1e6),
	gridHeightMm: optionalNumber('Grid height', 1, 1e6),
	notes: optionalText(5000)
});
/** The fields, then c_nom against c_min and Δc_dev (specifiedCover.ts); the issue is c_nom's. */
export const memberSchema = memberFieldsSchema.superRefine((member, ctx) => {
	const problem = cNomProblem(member);
	if (problem) ctx.addIssue({ code: 'custom', path: ['cNomMm'], message: problem });
});
export type MemberInput = z.infer<typeof memberSchema>;

export const holeSchema = z.object({
	label: text(80).min(1, 'Give the hole a label.'),
	xMm: optionalNumber('x', -1e7, 1e7),
	yMm: optionalNumber('y', -1e7, 1e7),
	meterReadingMm: requiredNumber('Meter reading', 0, 1000),
	measuredCoverMm: requiredNumber('Measured cover', 0, 1000),
	barDiameterMm: optionalNumber('Bar diameter', 1, 100),
	method: optionalText(80),
	notes: optionalText(5000)
});
export type HoleInput = z.infer<typeof holeSchema>;

export const reviewSchema = z.discriminatedUnion('decision', [
	z.object({ decision: z.literal('approve'), comment: optionalText(5000) }),
	z.object({
		decision: z.literal('return'),
		comment: text(5000).min(1, 'Say what must change before the survey can be approved.')
	})
]);

export const manualReadingSchema = z.object({
	x: z.string().max(40).default(''),
	y: z.string().max(40).default(''),
	cover: z.string().max(40),
	diameter: z.string().max(40).default(''),
	direction: z.string().max(40).default(''),
	note: z.string().max(600).default('')
});
export const manualEntrySchema = z.object({
	units: z.enum(['mm', 'inch']).default('mm'),
	rows: z.array(manualReadingSchema).min(1, 'Enter at least one reading.').max(5000)
});

/** Ids a device makes for what it records offline (crypto.randomUUID). */
export const clientIdSchema = z.uuid({ error: 'A client id must be a UUID.' });
const entryOf = { memberId: z.number().int().positive(), clientId: clientIdSchema };
/**
 * One send of a device's queued site entries for one survey. The batch id makes a resend of
 * the same batch a no-op; readings keep the entry grid's fields and checks.
 */
export const siteBatchSchema = z
	.object({
		batchId: clientIdSchema,
		units: z.enum(['mm', 'inch']).default('mm'),
		readings: z.array(manualReadingSchema.extend(entryOf)).max(5000).default([]),
		holes: z.array(holeSchema.extend(entryOf)).max(500).default([])
	})
	.refine((b) => b.readings.length + b.holes.length > 0, {
		message: 'The batch holds no readings and no holes.',
		path: ['readings']
	});
export type SiteBatch = z.infer<typeof siteBatchSchema>;

/** A photo's details sent beside its bytes (the body), in the query string. */
export const sitePhotoQuerySchema = z.object({
	clientId: clientIdSchema,
	memberId: z.coerce.number().int().positive(),
	fileName: z.string().min(1).max(255),
	caption: z.string().max(255).optional()
});
