import { z } from 'zod';
import { errorBodySchema } from '../schemas';
import { assetEndpoints } from './assetEndpoints';
import type { Endpoint } from './endpoint';
import { toOpenApiSchema, type JsonSchema } from './jsonSchema';
import { populationEndpoints } from './populationEndpoints';
import { researchEndpoints } from './researchEndpoints';

/**
 * The OpenAPI 3.1 document of /api/v1, generated from the endpoint list and its zod schemas.
 * Served at /api/v1/openapi.json and rendered on /docs/api.
 */
export const ENDPOINTS: Endpoint[] = [
	...assetEndpoints,
	...populationEndpoints,
	...researchEndpoints,
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

const ERROR_STATUSES: Record<string, string> = {
	'400': 'Invalid input: the body names the field.',
	'401': 'No valid token or session.',
	'403': 'Your role does not allow this.',
	'404': 'Not found, or not yours to see.',
	'429': 'Too many requests; see Retry-After.'
};

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

const ERROR_RESPONSES = Object.fromEntries(
	Object.entries(ERROR_STATUSES).map(([status, text]) => [
		status,
		{
			description: text,
			content: { 'application/json': { schema: { $ref: '#/components/schemas/Error' } } }
		}
	])
);

function requestBody(endpoint: Endpoint, components: Record<string, JsonSchema>) {
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
	return {
		description,
		...(headers.length ? { headers: Object.fromEntries(headers) } : {}),
		content: {
			[mediaType]: {
				schema: schema ? toOpenApiSchema(schema, 'output', components) : { type: 'string' }
			}
		}
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
		responses: { '200': successResponse(endpoint, components), ...ERROR_RESPONSES }
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
				'Read access to cover surveys, and anonymised research data across assets whose owners opted in. Authenticate with a personal API token: `Authorization: Bearer <token>` (create one on your account page). Errors: `{ error: { code, message, field? } }`. Rate limit per user: see the RateLimit-* headers; over it, 429 with Retry-After.'
		},
		servers: [{ url: serverUrl }],
		security: [{ bearerToken: [] }],
		tags: [
			{ name: 'Assets', description: "Your organisation's records." },
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
