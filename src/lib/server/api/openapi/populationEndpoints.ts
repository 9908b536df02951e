import { z } from 'zod';
import { calibrationSchema, groupSchema, methodSchema, scopeSchema } from '../../populations/query';
import { saveSchema } from '../../assessments/input';
import { customPopulationSchema, renameSchema } from '../../populations/custom';
import { READ_ONLY } from './errors';
import { idParam } from '../schemas';
import type { Endpoint } from './endpoint';

/**
 * The population pages' endpoints, documented here from their own query schemas.
 * Their answers are the analysis engine's results, documented as objects rather than field by
 * field (docs/analysis.md describes them).
 */
const engineResult = (what: string) => z.record(z.string(), z.unknown()).describe(what);
const assetParams = z.object({ assetId: idParam('asset') });
const customParams = assetParams.extend({ customId: idParam('custom population') });

export const populationEndpoints: Endpoint[] = [
	{
		method: 'get',
		path: '/api/v1/assets/{assetId}/populations',
		operationId: 'populationOverview',
		tag: 'Populations',
		summary: 'Every population of an asset (or one survey), judged by the engine',
		action: 'population:read',
		params: assetParams,
		query: scopeSchema.extend(methodSchema.shape),
		exampleQuery: 'split=face',
		response: {
			mediaType: 'application/json',
			schema: engineResult('The overview: one entry a population with its figures and rules.'),
			description: 'Population overview.'
		}
	},
	{
		method: 'get',
		path: '/api/v1/assets/{assetId}/populations/detail',
		operationId: 'populationDetail',
		tag: 'Populations',
		summary: 'One population with chart data, per-member boxes and the meter check',
		action: 'population:read',
		params: assetParams,
		query: scopeSchema
			.extend(groupSchema.shape)
			.extend(methodSchema.shape)
			.extend(calibrationSchema.shape),
		exampleQuery: 'type=deck&exposure=XD3',
		response: {
			mediaType: 'application/json',
			schema: z.object({
				population: engineResult('The engine assessment with charts.'),
				boxes: z.array(z.unknown()).describe('Box-plot figures per member.'),
				meter: engineResult('Meter verification from the check holes.').nullable(),
				calibration: engineResult(
					'With calibration=apply: the verdict as read and through the check-hole calibration, its uncertainty included, the method in words and whether the outcome changes.'
				).nullable()
			}),
			description: 'Population detail.'
		}
	},
	{
		method: 'get',
		path: '/api/v1/assets/{assetId}/populations/custom',
		operationId: 'customPopulations',
		tag: 'Populations',
		summary: 'The populations the engineers made from chosen members of the asset',
		action: 'population:read',
		params: assetParams,
		response: {
			mediaType: 'application/json',
			schema: z.object({ populations: z.array(engineResult('A custom population.')) }),
			description: 'Custom populations, oldest first.'
		}
	},
	{
		method: 'post',
		path: '/api/v1/assets/{assetId}/populations/custom',
		operationId: 'createCustomPopulation',
		tag: 'Populations',
		summary: 'Save a population of chosen members (split out of a group with splitFrom); audited',
		description:
			'Owning organisation only. Judge it with the detail endpoint and custom=<id> (part=rest for what is left of the group).',
		action: 'assessment:write',
		params: assetParams,
		body: customPopulationSchema,
		exampleBody: { name: 'Bay 4', members: [1], splitFrom: 'deck|XD3' },
		response: {
			status: 201,
			mediaType: 'application/json',
			schema: z.object({ population: engineResult('The saved population.') }),
			description: 'Saved.'
		}
	},
	{
		method: 'patch',
		path: '/api/v1/assets/{assetId}/populations/custom/{customId}',
		operationId: 'renameCustomPopulation',
		tag: 'Populations',
		summary: 'Rename a population the engineers made; audited with the old and new name',
		description:
			'Owning organisation only. The name stays unique on the asset: of two renames to one name, one wins and the other answers 400 naming the field.',
		action: 'assessment:write',
		params: customParams,
		body: renameSchema,
		exampleBody: { name: 'Bay 4, low patch' },
		response: {
			mediaType: 'application/json',
			schema: z.object({ population: engineResult('The renamed population.') }),
			description: 'Renamed.'
		},
		errors: { '403': READ_ONLY }
	},
	{
		method: 'delete',
		path: '/api/v1/assets/{assetId}/populations/custom/{customId}',
		operationId: 'deleteCustomPopulation',
		tag: 'Populations',
		summary: 'Delete a population the engineers made; audited with what it held',
		description:
			'Owning organisation only. Assessments that carry it keep their own copy in their snapshot and read the same afterwards.',
		action: 'assessment:write',
		params: customParams,
		response: { status: 204, description: 'Deleted.' },
		errors: { '403': READ_ONLY }
	},
	{
		method: 'get',
		path: '/api/v1/members/{memberId}/cover-map',
		operationId: 'memberCoverMap',
		tag: 'Populations',
		summary: "A member's readings on its grid, its check holes and the meter's bias",
		action: 'population:read',
		params: z.object({ memberId: idParam('member') }),
		response: {
			mediaType: 'application/json',
			schema: engineResult('The member view.'),
			description: 'Cover map data.'
		}
	},
	{
		method: 'get',
		path: '/api/v1/assets/{assetId}/assessments',
		operationId: 'listAssessments',
		tag: 'Populations',
		summary: "The asset's assessments, newest first",
		action: 'assessment:read',
		params: assetParams,
		response: {
			mediaType: 'application/json',
			schema: z.object({ assessments: z.array(z.unknown()) }),
			description: 'Assessment summaries.'
		}
	},
	{
		method: 'post',
		path: '/api/v1/assets/{assetId}/assessments',
		operationId: 'saveAssessment',
		tag: 'Populations',
		summary: 'Compute the populations now and keep them as a draft assessment; audited',
		description:
			'Owning organisation only. The snapshot keeps the engine\'s figures, methods and engine version; it never changes once approved. calibration "apply" also judges each population through its members\' check holes, beside the verdict as read.',
		action: 'assessment:write',
		params: assetParams,
		body: saveSchema,
		exampleBody: { title: 'Deck and soffits, as surveyed', calibration: 'apply' },
		response: {
			status: 201,
			mediaType: 'application/json',
			schema: z.object({ assessment: engineResult('The saved draft, summarised.') }),
			description: 'Saved as a draft.'
		}
	}
];
