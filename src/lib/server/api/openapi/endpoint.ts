import type { z } from 'zod';
import type { Action } from '../../policy';

/**
 * One documented API operation. The OpenAPI document is built from a list of these, and the
 * integration test calls each one once with its example and checks the answer against its
 * schema, so a route cannot drift from its documentation unnoticed.
 */
export type MediaType = 'application/json' | 'text/csv' | 'application/x-ndjson';

export interface Endpoint {
	method: 'get' | 'put';
	/** OpenAPI path, with {param} placeholders. */
	path: string;
	operationId: string;
	tag: 'Assets' | 'Research' | 'Populations' | 'Documentation';
	summary: string;
	description?: string;
	/** The policy action the route asks for; the test picks a demo role that has it. */
	action: Action | null;
	params?: z.ZodObject;
	query?: z.ZodObject;
	body?: z.ZodType;
	/** An example body for the test (PUT). */
	exampleBody?: unknown;
	/** An example query string for the test, without '?'. */
	exampleQuery?: string;
	response: { mediaType: MediaType; schema?: z.ZodType; description: string };
	/** Response headers worth documenting (name → description). */
	headers?: Record<string, string>;
}
