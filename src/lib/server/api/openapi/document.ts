import { z } from 'zod';
import { errorBodySchema } from '../schemas';
import { assetEndpoints } from './assetEndpoints';
import type { Endpoint } from './endpoint';
import { errorResponses } from './errors';
import { attachmentEndpoints } from './attachmentEndpoints';
import { importEndpoints } from './importEndpoints';
import { intakeRecordEndpoints } from './intakeRecordEndpoints';
import { measurementEndpoints } from './measurementEndpoints';
import { toOpenApiSchema, type JsonSchema } from './jsonSchema';
import { planEndpoints } from './planEndpoints';
import { populationEndpoints } from './populationEndpoints';
import { researchEndpoints } from './researchEndpoints';
import { surveyStateEndpoints } from './surveyStateEndpoints';

/**
 * The OpenAPI 3.1 document of /api/v1, generated from the endpoint list and its zod schemas.
 * Served at /api/v1/openapi.json and rendered on /docs/api.
 */
export const ENDPOINTS: Endpoint[] = [
	...assetEndpoints,
	...populationEndpoints,
	...researchEndpoints,
	// In the order a survey is taken in, which is the order the test calls them.
	...intakeRecordEndpoints,
	...measurementEndpoints,
	...planEndpoints,
	...importEndpoints,
	...attachmentEndpoints,
	...surveyStateEndpoints,
	{
		method: 'get',
		path: '/api/v1/openapi.json',
		operationId: 'openApiDocument',
		tag: 'Documentation',
		summary: 'This document',
		action: null,
		response: { mediaType: 'application/json', description: 'OpenAPI 3.1.' }
	}
];

function parameters(endpoint: Endpoint, components: Record<string, JsonSchema>) {
	const out: Record<string, unknown>[] = [];
	for (const [where, schema] of [
		['path', endpoint.params],
		['query', endpoint.query]
	] as const) {
		if (!schema) continue;
		for (const [name, field] of Object.entries(schema.shape)) {
			const json = toOpenApiSchema(field as z.ZodType, 'input', components);
			const isList = json.type === 'array';
			out.push({
				name,
				in: where,
				required: where === 'path',
				description: (field as z.ZodType).description,
				schema: json,
				...(isList ? { style: 'form', explode: true } : {})
			});
		}
	}
	return out;
}

function requestBody(endpoint: Endpoint, components: Record<string, JsonSchema>) {
	if (endpoint.file) {
		const { mediaTypes, description } = endpoint.file;
		const content = Object.fromEntries(mediaTypes.map((type) => [type, {}]));
		return { requestBody: { required: true, description, content } };
	}
	if (!endpoint.body) return {};
	const schema = toOpenApiSchema(endpoint.body, 'input', components);
	return { requestBody: { required: true, content: { 'application/json': { schema } } } };
}

function successResponse(endpoint: Endpoint, components: Record<string, JsonSchema>) {
	const { mediaType, schema, description } = endpoint.response;
	const headers = Object.entries(endpoint.headers ?? {}).map(([name, text]) => [
		name,
		{ description: text, schema: { type: 'string' } }
	]);
	const body = schema ? toOpenApiSchema(schema, 'output', components) : { type: 'string' };
	return {
		description,
		...(headers.length ? { headers: Object.fromEntries(headers) } : {}),
		...(mediaType ? { content: { [mediaType]: { schema: body } } } : {})
	};
}

function operation(endpoint: Endpoint, components: Record<string, JsonSchema>) {
	return {
		operationId: endpoint.operationId,
		tags: [endpoint.tag],
		summary: endpoint.summary,
		...(endpoint.description ? { description: endpoint.description } : {}),
		// A public operation says so by an empty security list, which overrides the document's.
		...(endpoint.action ? {} : { security: [] }),
		parameters: parameters(endpoint, components),
		...requestBody(endpoint, components),
		responses: {
			[String(endpoint.response.status ?? 200)]: successResponse(endpoint, components),
			...errorResponses(endpoint)
		}
	};
}

export function openApiDocument(serverUrl: string) {
	const components: Record<string, JsonSchema> = {};
	toOpenApiSchema(errorBodySchema, 'output', components);
	const paths: Record<string, Record<string, unknown>> = {};
	for (const endpoint of ENDPOINTS) {
		paths[endpoint.path] ??= {};
		paths[endpoint.path][endpoint.method] = operation(endpoint, components);
	}
	return {
		openapi: '3.1.0',
		info: {
			title: 'Fractile API',
			version: '1',
			description:
				'Cover surveys: read them, take them in (assets, surveys, members, check holes, readings typed or imported from CSV/XLSX, attachments), and anonymised research data across assets whose owners opted in. Authenticate with a personal API token: `Authorization: Bearer <token>` (create one on your account page). Errors: `{ error: { code, message, field? } }`. Rate limit per user: see the RateLimit-* headers; over it, 429 with Retry-After.'
		},
		servers: [{ url: serverUrl }],
		security: [{ bearerToken: [] }],
		tags: [
			{ name: 'Assets', description: "Your organisation's records." },
			{
				name: 'Intake',
				description:
					'Getting a survey in: records, readings and files. A submitted or approved survey is frozen (409).'
			},
			{ name: 'Populations', description: "Engine judgements of an asset's populations." },
			{ name: 'Research', description: 'Anonymised data of opted-in assets.' },
			{ name: 'Documentation', description: 'This document.' }
		],
		paths,
		components: {
			securitySchemes: {
				bearerToken: {
					type: 'http',
					scheme: 'bearer',
					description: 'A personal API token (frt_…).'
				}
			},
			schemas: components
		}
	};
}
