import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { openApiDocument } from '$lib/server/api/openapi/document';

/** The OpenAPI 3.1 document of /api/v1, public so tools can read it before a token exists. */
export const GET: RequestHandler = ({ url }) => json(openApiDocument(url.origin));
