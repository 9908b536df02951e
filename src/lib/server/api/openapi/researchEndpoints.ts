import { z } from 'zod';
import {
	exportListSchema,
	exportManifestSchema,
	researchMemberListSchema,
	researchReadingPageSchema,
	researchStatisticsSchema,
	statisticsQuerySchema
} from '../../research/apiSchemas';
import { researchFilterSchema } from '../../research/filter';
import { idParam } from '../schemas';
import { pageQuerySchema } from '../cursor';
import type { Endpoint } from './endpoint';

/** The research endpoints: anonymised, across every opted-in asset of every organisation. */
const exportHeaders = {
	'x-research-export-id':
		'Id of the export record; GET /api/v1/research/exports/{exportId} for its manifest.',
	link: 'rel="describedby": the manifest (README, data dictionary, citation).'
};

const streamed = (format: string) =>
	`Streamed: rows are read from the database a batch at a time while they are sent, so any size exports in bounded memory. Recorded in research_exports (filter, row count when finished, engine version, time). ${format}`;

export const researchEndpoints: Endpoint[] = [
	{
		method: 'get',
		path: '/api/v1/research/members',
		operationId: 'listResearchMembers',
		tag: 'Research',
		summary: 'Anonymised members of the selection',
		action: 'research:read',
		query: researchFilterSchema,
		exampleQuery: 'memberType=deck',
		response: {
			mediaType: 'application/json',
			schema: researchMemberListSchema,
			description: 'Members, pseudonymised.'
		}
	},
	{
		method: 'get',
		path: '/api/v1/research/readings',
		operationId: 'listResearchReadings',
		tag: 'Research',
		summary: 'Anonymised readings of the selection, a page at a time',
		action: 'research:read',
		query: researchFilterSchema.extend(pageQuerySchema.shape),
		exampleQuery: 'exposureClass=XD3&limit=50',
		response: {
			mediaType: 'application/json',
			schema: researchReadingPageSchema,
			description: 'One page of readings and the cursor of the next.'
		}
	},
	{
		method: 'get',
		path: '/api/v1/research/statistics',
		operationId: 'researchStatistics',
		tag: 'Research',
		summary: 'Engine statistics of the selection and of groups within it',
		description:
			'Cover, deviation from nominal (measured − c_nom) and share below c_min, by the analysis engine, for the whole selection and each group.',
		action: 'research:read',
		query: statisticsQuerySchema,
		exampleQuery: 'groupBy=memberType,exposureClass&charts=true',
		response: {
			mediaType: 'application/json',
			schema: researchStatisticsSchema,
			description: 'Statistics.'
		}
	},
	{
		method: 'get',
		path: '/api/v1/research/exports',
		operationId: 'listResearchExports',
		tag: 'Research',
		summary: "The caller's organisation's exports, newest first",
		action: 'research:export',
		response: {
			mediaType: 'application/json',
			schema: exportListSchema,
			description: 'Export records.'
		}
	},
	{
		method: 'get',
		path: '/api/v1/research/exports/readings.csv',
		operationId: 'exportReadingsCsv',
		tag: 'Research',
		summary: 'Export the selected readings as CSV',
		description: streamed('Text cells that start with =, +, - or @ get a leading apostrophe.'),
		action: 'research:export',
		query: researchFilterSchema,
		exampleQuery: 'memberType=column',
		headers: exportHeaders,
		response: { mediaType: 'text/csv', description: 'Header line, then one line a reading.' }
	},
	{
		method: 'get',
		path: '/api/v1/research/exports/readings.jsonl',
		operationId: 'exportReadingsJsonLines',
		tag: 'Research',
		summary: 'Export the selected readings as JSON Lines',
		description: streamed('One JSON object (ResearchReading) a line.'),
		action: 'research:export',
		query: researchFilterSchema,
		exampleQuery: 'memberType=column',
		headers: exportHeaders,
		response: { mediaType: 'application/x-ndjson', description: 'One ResearchReading a line.' }
	},
	{
		method: 'get',
		path: '/api/v1/research/exports/groups.csv',
		operationId: 'exportGroupStatisticsCsv',
		tag: 'Research',
		summary: 'Export the group statistics as CSV',
		description:
			'One line for the whole selection, then one a group. Recorded like the readings exports.',
		action: 'research:export',
		query: statisticsQuerySchema.omit({ charts: true }),
		exampleQuery: 'groupBy=memberType',
		headers: exportHeaders,
		response: { mediaType: 'text/csv', description: 'Group statistics.' }
	},
	{
		method: 'get',
		path: '/api/v1/research/exports/{exportId}',
		operationId: 'researchExportManifest',
		tag: 'Research',
		summary: "An export's manifest: record, citation, README and data dictionary",
		action: 'research:export',
		params: z.object({ exportId: idParam('export') }),
		response: {
			mediaType: 'application/json',
			schema: exportManifestSchema,
			description: 'The manifest.'
		}
	},
	{
		method: 'get',
		path: '/api/v1/research/dictionary',
		operationId: 'researchDataDictionary',
		tag: 'Research',
		summary: 'The data dictionary (JSON Schema of every column)',
		action: 'research:read',
		response: {
			mediaType: 'application/json',
			schema: z.record(z.string(), z.unknown()),
			description: 'JSON Schema 2020-12.'
		}
	}
];
