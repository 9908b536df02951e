import { z } from 'zod';
import {
	assetListSchema,
	idParam,
	memberListSchema,
	readingPageSchema,
	surveyListSchema
} from '../schemas';
import { consentBodySchema, consentSchema } from '../../research/apiSchemas';
import { pageQuerySchema } from '../cursor';
import type { Endpoint } from './endpoint';

/** Reads of the caller's own (and shared) records, and the owner's research consent. */
export const assetEndpoints: Endpoint[] = [
	{
		method: 'get',
		path: '/api/v1/assets',
		operationId: 'listAssets',
		tag: 'Assets',
		summary: 'Assets your organisation owns or has been shared',
		action: 'asset:read',
		response: { mediaType: 'application/json', schema: assetListSchema, description: 'Assets.' }
	},
	{
		method: 'get',
		path: '/api/v1/assets/{assetId}/surveys',
		operationId: 'listSurveys',
		tag: 'Assets',
		summary: 'Surveys of an asset',
		action: 'survey:read',
		params: z.object({ assetId: idParam('asset') }),
		response: { mediaType: 'application/json', schema: surveyListSchema, description: 'Surveys.' }
	},
	{
		method: 'get',
		path: '/api/v1/surveys/{surveyId}/members',
		operationId: 'listMembers',
		tag: 'Assets',
		summary: 'Members of a survey with their specified cover',
		action: 'survey:read',
		params: z.object({ surveyId: idParam('survey') }),
		response: { mediaType: 'application/json', schema: memberListSchema, description: 'Members.' }
	},
	{
		method: 'get',
		path: '/api/v1/members/{memberId}/readings',
		operationId: 'listReadings',
		tag: 'Assets',
		summary: "A member's readings, a page at a time (cursor pagination)",
		action: 'survey:read',
		params: z.object({ memberId: idParam('member') }),
		query: pageQuerySchema,
		exampleQuery: 'limit=100',
		response: { mediaType: 'application/json', schema: readingPageSchema, description: 'A page.' }
	},
	{
		method: 'get',
		path: '/api/v1/assets/{assetId}/research-consent',
		operationId: 'readResearchConsent',
		tag: 'Assets',
		summary: "The asset's consent to anonymised research use",
		action: 'research:consent',
		params: z.object({ assetId: idParam('asset') }),
		response: { mediaType: 'application/json', schema: consentSchema, description: 'Consent.' }
	},
	{
		method: 'put',
		path: '/api/v1/assets/{assetId}/research-consent',
		operationId: 'setResearchConsent',
		tag: 'Assets',
		summary: 'Opt the asset in to (or out of) anonymised research use',
		description:
			'Owning organisation only; audited. Opting out removes the asset from every later research view and export.',
		action: 'research:consent',
		params: z.object({ assetId: idParam('asset') }),
		body: consentBodySchema,
		exampleBody: { researchOptIn: true },
		response: { mediaType: 'application/json', schema: consentSchema, description: 'Consent now.' }
	}
];
