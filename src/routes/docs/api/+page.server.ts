import type { PageServerLoad } from './$types';
import { openApiDocument } from '$lib/server/api/openapi/document';
import { operationsOf, schemaTables } from './operations';

/** The API reference, rendered from the same OpenAPI document the API serves. */
export const load: PageServerLoad = ({ url }) => {
	const document = openApiDocument(url.origin);
	return {
		info: document.info,
		operations: operationsOf(document.paths),
		schemas: schemaTables(document.components?.schemas ?? {})
	};
};
