import type { PageServerLoad } from './$types';
import { openApiDocument } from '$lib/server/api/openapi/document';

/** The API reference, rendered from the same OpenAPI document the API serves. */
export const load: PageServerLoad = ({ url }) => {
	const document = openApiDocument(url.origin);
	const operations = Object.entries(document.paths).flatMap(([path, methods]) =>
		Object.entries(methods).map(([method, op]) => {
			const o = op as {
				operationId: string;
				summary: string;
				description?: string;
				tags: string[];
				parameters: { name: string; in: string; description?: string; schema: { type?: unknown } }[];
				responses: { '200': { content: Record<string, { schema: { $ref?: string } }> } };
			};
			const [mediaType, media] = Object.entries(o.responses['200'].content)[0];
			return {
				id: o.operationId,
				method: method.toUpperCase(),
				path,
				summary: o.summary,
				description: o.description ?? '',
				tag: o.tags[0],
				parameters: o.parameters.map((p) => ({
					name: p.name,
					in: p.in,
					type: Array.isArray(p.schema.type) ? p.schema.type.join(' | ') : String(p.schema.type ?? 'string'),
					description: p.description ?? ''
				})),
				mediaType,
				schemaName: media.schema.$ref?.split('/').pop() ?? null
			};
		})
	);
	return { info: document.info, operations };
};
