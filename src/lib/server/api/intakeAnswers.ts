import { z } from 'zod';
import { assetSchema, holeSchema, memberSchema, surveySchema } from '$lib/intake/schemas';
import {
	carbonationTestSchema,
	chlorideIncrementSchema,
	chlorideProfileSchema
} from '$lib/intake/measurements';
import { ATTACHMENT_KINDS, SURVEY_STATES } from '$lib/words';

/**
 * Shapes of intake's write answers. A saved record is what its create/edit body became (the same
 * zod schema, its output side) plus what the database adds; the OpenAPI document is generated
 * from these, and the integration test checks every route's answer against them.
 */
export const isoTime = z.iso.datetime().describe('ISO 8601, UTC.');
const id = (what: string) => z.number().int().describe(`Id of the ${what}.`);
const saved = { createdAt: isoTime, updatedAt: isoTime };

export const assetRecordSchema = assetSchema
	.extend({
		id: id('asset'),
		organisationId: id('owning organisation'),
		researchOptIn: z.boolean(),
		researchOptInChangedAt: isoTime.nullable().optional().describe('Absent on a new asset.'),
		...saved
	})
	.meta({ id: 'AssetRecord' });

export const surveyRecordSchema = surveySchema
	.extend({
		id: id('survey'),
		assetId: id('asset'),
		surveyorUserId: id('surveyor (user)').nullable(),
		status: z.enum(SURVEY_STATES),
		// A new survey's answer holds what was written; these come once it has moved on.
		statusComment: z.string().nullable().optional().describe("The engineer's comment."),
		submittedAt: isoTime.nullable().optional(),
		reviewedAt: isoTime.nullable().optional(),
		reviewedByUserId: id('reviewing engineer (user)').nullable().optional(),
		...saved
	})
	.meta({ id: 'SurveyRecord' });

export const memberRecordSchema = memberSchema
	.extend({ id: id('member'), surveyId: id('survey'), assetId: id('asset'), ...saved })
	.meta({ id: 'MemberRecord' });

export const holeRecordSchema = holeSchema
	.extend({ id: id('verification hole'), memberId: id('member'), createdAt: isoTime })
	.meta({ id: 'HoleRecord' });

export const carbonationTestRecordSchema = carbonationTestSchema
	.extend({ id: id('carbonation test'), memberId: id('member'), createdAt: isoTime })
	.meta({ id: 'CarbonationTestRecord' });

// safeExtend: the record's increments replace the input's (a refined schema's keys may only be
// overwritten by a subtype), adding what the server works out.
export const chlorideProfileRecordSchema = chlorideProfileSchema
	.safeExtend({
		id: id('chloride profile'),
		memberId: id('member'),
		createdAt: isoTime,
		conversion: z
			.string()
			.nullable()
			.describe('How contents of concrete become % of binder, with the values assumed.'),
		increments: z.array(
			chlorideIncrementSchema.extend({
				percentOfBinder: z.number().describe('The content as % by mass of binder.'),
				outermost: z
					.boolean()
					.describe('The increment at the surface, which a fit of the profile leaves out.')
			})
		)
	})
	.meta({ id: 'ChlorideProfileRecord' });

export const attachmentRecordSchema = z
	.object({
		id: id('attachment'),
		surveyId: id('survey'),
		memberId: id('member').nullable(),
		kind: z.enum(ATTACHMENT_KINDS),
		fileName: z.string().describe('Sanitised on upload.'),
		contentType: z.string().describe('Judged from the bytes, not from the request.'),
		byteSize: z.number().int(),
		sha256: z.string(),
		storageKey: z.string().describe('Where object storage holds it; download through the API.'),
		thumbnailKey: z.string().nullable().describe('Images only: a 320 px JPEG.'),
		caption: z.string().nullable(),
		uploadedByUserId: id('user').nullable(),
		createdAt: isoTime
	})
	.meta({ id: 'AttachmentRecord' });

export const assetAnswerSchema = z.object({ asset: assetRecordSchema });
export const surveyAnswerSchema = z.object({ survey: surveyRecordSchema });
export const memberAnswerSchema = z.object({ member: memberRecordSchema });
export const holeAnswerSchema = z.object({ hole: holeRecordSchema });
export const carbonationTestAnswerSchema = z.object({
	carbonationTest: carbonationTestRecordSchema
});
export const carbonationTestsAnswerSchema = z.object({
	carbonationTests: z.array(carbonationTestRecordSchema)
});
export const chlorideProfileAnswerSchema = z.object({
	chlorideProfile: chlorideProfileRecordSchema
});
export const chlorideProfilesAnswerSchema = z.object({
	chlorideProfiles: z.array(chlorideProfileRecordSchema)
});
export const attachmentAnswerSchema = z.object({ attachment: attachmentRecordSchema });
export const membersCreatedSchema = z.object({
	created: z.number().int().describe('Members created: every row of the table.')
});
