import { assetSchema, holeSchema, memberSchema, surveySchema } from '$lib/intake/schemas';
import { pastedTableSchema } from '../../intake/pastedMembers';
import {
	assetAnswerSchema,
	holeAnswerSchema,
	memberAnswerSchema,
	membersCreatedSchema,
	surveyAnswerSchema
} from '../intakeAnswers';
import { jsonAnswer, recordParams, type Endpoint } from './endpoint';
import { FROZEN, READ_ONLY } from './errors';
import {
	exampleAsset,
	exampleHole,
	exampleMember,
	exampleMemberTable,
	exampleSurvey
} from './intakeExamples';

// Named, so that the document writes each body once; the same schemas the routes validate with.
const assetBody = assetSchema.meta({ id: 'AssetInput' });
const surveyBody = surveySchema.meta({ id: 'SurveyInput' });
const memberBody = memberSchema.meta({ id: 'MemberInput' });
const holeBody = holeSchema.meta({ id: 'HoleInput' });
const MEMBER_400 =
	'Invalid input (`field` names it): a label already used in the survey, or c_nom below c_min or below c_min + Δc_dev (EN 1992-1-1 (4.1)), on `cNomMm`.';
const HOLE_400 = 'Invalid input (`field` names it), or a hole label already on the member.';

/**
 * Intake's record writes: the bodies are the create/edit forms' own schemas
 * (src/lib/intake/schemas.ts). An edit (PUT) takes the whole record, as the form does.
 * Each example follows from the one before (intakeExamples.ts): an asset, then its survey…
 */
export const intakeRecordEndpoints: Endpoint[] = [
	{
		method: 'post',
		path: '/api/v1/assets',
		operationId: 'createAsset',
		tag: 'Intake',
		summary: 'Record an asset of your organisation',
		action: 'asset:write',
		body: assetBody,
		exampleBody: exampleAsset,
		response: jsonAnswer(assetAnswerSchema, 'The asset as saved.', 201)
	},
	{
		method: 'put',
		path: '/api/v1/assets/{assetId}',
		operationId: 'updateAsset',
		tag: 'Intake',
		summary: 'Correct an asset (the whole record; audited, old and new values)',
		action: 'asset:write',
		params: recordParams('asset'),
		body: assetBody,
		exampleBody: { ...exampleAsset, locationText: 'Quarry Lane, east abutment' },
		response: jsonAnswer(assetAnswerSchema, 'The asset now.'),
		errors: { '403': READ_ONLY }
	},
	{
		method: 'post',
		path: '/api/v1/assets/{assetId}/surveys',
		operationId: 'createSurvey',
		tag: 'Intake',
		summary: 'Start a survey of an asset (a draft)',
		action: 'survey:create',
		params: recordParams('asset'),
		body: surveyBody,
		exampleBody: exampleSurvey,
		response: jsonAnswer(surveyAnswerSchema, 'The survey, a draft.', 201),
		errors: { '403': READ_ONLY }
	},
	{
		method: 'put',
		path: '/api/v1/surveys/{surveyId}',
		operationId: 'updateSurvey',
		tag: 'Intake',
		summary: "Correct a survey's details (the whole record; audited)",
		action: 'survey:edit',
		params: recordParams('survey'),
		body: surveyBody,
		exampleBody: { ...exampleSurvey, surveyorName: 'R. Okafor', meterCalibration: '2026-01' },
		response: jsonAnswer(surveyAnswerSchema, 'The survey now.'),
		errors: { '403': READ_ONLY, '409': FROZEN }
	},
	{
		method: 'post',
		path: '/api/v1/surveys/{surveyId}/members',
		operationId: 'createMember',
		tag: 'Intake',
		summary: 'Add a member with its specified cover',
		action: 'member:write',
		params: recordParams('survey'),
		body: memberBody,
		exampleBody: exampleMember,
		response: jsonAnswer(memberAnswerSchema, 'The member as saved.', 201),
		errors: { '400': MEMBER_400, '403': READ_ONLY, '409': FROZEN }
	},
	{
		method: 'post',
		path: '/api/v1/surveys/{surveyId}/members/bulk',
		operationId: 'createMembersFromTable',
		tag: 'Intake',
		summary: 'Add members from a table pasted from a spreadsheet, all or none',
		action: 'member:write',
		params: recordParams('survey'),
		body: pastedTableSchema,
		exampleBody: { table: exampleMemberTable },
		response: jsonAnswer(membersCreatedSchema, 'How many were created.', 201),
		errors: {
			'400':
				'A row breaks the member rules or repeats a label: `field` is `table`, the message names each row and field; no member is created.',
			'403': READ_ONLY,
			'409': FROZEN
		}
	},
	{
		method: 'put',
		path: '/api/v1/members/{memberId}',
		operationId: 'updateMember',
		tag: 'Intake',
		summary: "Correct a member's specified values (the whole record; audited)",
		action: 'member:write',
		params: recordParams('member'),
		body: memberBody,
		// A project may specify more than c_min + Δc_dev.
		exampleBody: { ...exampleMember, cNomMm: 45 },
		response: jsonAnswer(memberAnswerSchema, 'The member now.'),
		errors: { '400': MEMBER_400, '403': READ_ONLY, '409': FROZEN }
	},
	{
		method: 'post',
		path: '/api/v1/members/{memberId}/holes',
		operationId: 'createHole',
		tag: 'Intake',
		summary: "Record a verification hole: the meter's reading beside the cover measured",
		action: 'hole:write',
		params: recordParams('member'),
		body: holeBody,
		exampleBody: exampleHole,
		response: jsonAnswer(holeAnswerSchema, 'The hole as saved.', 201),
		errors: { '400': HOLE_400, '403': READ_ONLY, '409': FROZEN }
	},
	{
		method: 'put',
		path: '/api/v1/holes/{holeId}',
		operationId: 'updateHole',
		tag: 'Intake',
		summary: 'Correct a verification hole (the whole hole; audited)',
		action: 'hole:write',
		params: recordParams('hole', 'verification hole'),
		body: holeBody,
		exampleBody: { ...exampleHole, measuredCoverMm: 40.5 },
		response: jsonAnswer(holeAnswerSchema, 'The hole now.'),
		errors: { '400': HOLE_400, '403': READ_ONLY, '409': FROZEN }
	},
	{
		method: 'delete',
		path: '/api/v1/holes/{holeId}',
		operationId: 'deleteHole',
		tag: 'Intake',
		summary: 'Remove a hole recorded in error (the audit event keeps what it said)',
		action: 'hole:write',
		params: recordParams('hole', 'verification hole'),
		response: { status: 204, description: 'Removed.' },
		errors: { '403': READ_ONLY, '409': FROZEN }
	}
];
