import { carbonationTestSchema, chlorideProfileSchema } from '$lib/intake/measurements';
import {
	carbonationTestAnswerSchema,
	carbonationTestsAnswerSchema,
	chlorideProfileAnswerSchema,
	chlorideProfilesAnswerSchema
} from '../intakeAnswers';
import { jsonAnswer, recordParams, type Endpoint } from './endpoint';
import { FROZEN, READ_ONLY } from './errors';
import { exampleCarbonationTest, exampleChlorideProfile } from './intakeExamples';

const carbonationBody = carbonationTestSchema.meta({ id: 'CarbonationTestInput' });
const chlorideBody = chlorideProfileSchema.meta({ id: 'ChlorideProfileInput' });
const LABEL_400 =
	'Invalid input (`field` names it; an increment’s problem names the increment), or a label already used on the member.';

/**
 * The durability measurements of a member (src/lib/intake/measurements.ts): carbonation tests and
 * chloride profiles, recorded while the survey is a draft or returned, frozen with it after.
 * A correction is a delete and a new record, both audited.
 */
export const measurementEndpoints: Endpoint[] = [
	{
		method: 'post',
		path: '/api/v1/members/{memberId}/carbonation-tests',
		operationId: 'createCarbonationTest',
		tag: 'Intake',
		summary: 'Record a carbonation test: depths of the carbonated front, as read',
		action: 'measurement:write',
		params: recordParams('member'),
		body: carbonationBody,
		exampleBody: exampleCarbonationTest,
		response: jsonAnswer(carbonationTestAnswerSchema, 'The test as saved.', 201),
		errors: { '400': LABEL_400, '403': READ_ONLY, '409': FROZEN }
	},
	{
		method: 'get',
		path: '/api/v1/members/{memberId}/carbonation-tests',
		operationId: 'listCarbonationTests',
		tag: 'Intake',
		summary: 'The carbonation tests of a member, by test date',
		action: 'survey:read',
		params: recordParams('member'),
		response: jsonAnswer(carbonationTestsAnswerSchema, 'Every test of the member.')
	},
	{
		method: 'get',
		path: '/api/v1/carbonation-tests/{carbonationTestId}',
		operationId: 'getCarbonationTest',
		tag: 'Intake',
		summary: 'One carbonation test',
		action: 'survey:read',
		params: recordParams('carbonationTest', 'carbonation test'),
		response: jsonAnswer(carbonationTestAnswerSchema, 'The test.')
	},
	{
		method: 'post',
		path: '/api/v1/members/{memberId}/chloride-profiles',
		operationId: 'createChlorideProfile',
		tag: 'Intake',
		summary:
			'Record a chloride profile: contents at depth increments from the surface inwards, with their basis',
		description:
			'The first increment is the outermost and is flagged so; contents by mass of concrete need the assumed binder content and concrete density, and the answer gives each content as % of binder with the conversion in words.',
		action: 'measurement:write',
		params: recordParams('member'),
		body: chlorideBody,
		exampleBody: exampleChlorideProfile,
		response: jsonAnswer(chlorideProfileAnswerSchema, 'The profile as saved.', 201),
		errors: { '400': LABEL_400, '403': READ_ONLY, '409': FROZEN }
	},
	{
		method: 'get',
		path: '/api/v1/members/{memberId}/chloride-profiles',
		operationId: 'listChlorideProfiles',
		tag: 'Intake',
		summary: 'The chloride profiles of a member, with their increments',
		action: 'survey:read',
		params: recordParams('member'),
		response: jsonAnswer(chlorideProfilesAnswerSchema, 'Every profile of the member.')
	},
	{
		method: 'get',
		path: '/api/v1/chloride-profiles/{chlorideProfileId}',
		operationId: 'getChlorideProfile',
		tag: 'Intake',
		summary: 'One chloride profile with its increments',
		action: 'survey:read',
		params: recordParams('chlorideProfile', 'chloride profile'),
		response: jsonAnswer(chlorideProfileAnswerSchema, 'The profile.')
	},
	{
		method: 'delete',
		path: '/api/v1/carbonation-tests/{carbonationTestId}',
		operationId: 'deleteCarbonationTest',
		tag: 'Intake',
		summary: 'Remove a carbonation test recorded in error (the audit event keeps it)',
		action: 'measurement:write',
		params: recordParams('carbonationTest', 'carbonation test'),
		response: { status: 204, description: 'Removed.' },
		errors: { '403': READ_ONLY, '409': FROZEN }
	},
	{
		method: 'delete',
		path: '/api/v1/chloride-profiles/{chlorideProfileId}',
		operationId: 'deleteChlorideProfile',
		tag: 'Intake',
		summary: 'Remove a chloride profile recorded in error, with its increments (audited)',
		action: 'measurement:write',
		params: recordParams('chlorideProfile', 'chloride profile'),
		response: { status: 204, description: 'Removed.' },
		errors: { '403': READ_ONLY, '409': FROZEN }
	}
];
