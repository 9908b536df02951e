import { z } from 'zod';
import type { Action } from '../../policy';
import { idParam } from '../schemas';

/**
 * One documented API operation. The OpenAPI document is built from a list of these, and the
 * integration test calls each one once with its example and checks the answer against its
 * schema, so a route cannot drift from its documentation unnoticed.
 */
export type MediaType =
	| 'application/json'
	| 'text/csv'
	| 'application/x-ndjson'
	| 'application/pdf'
	/** A stored file answered with its own type (an attachment). */
	| '*/*';

/** Error answers an operation documents beyond the ones every operation of its kind gives. */
export type ErrorStatus = '400' | '403' | '404' | '409' | '413' | '503';

/** A request body that is a file itself, sent raw (not multipart) so it streams to storage. */
export interface FileBody {
	mediaTypes: string[];
	description: string;
	/** The test's example file. */
	example: { contentType: string; text: string };
}

export interface Endpoint {
	method: 'get' | 'put' | 'patch' | 'post' | 'delete';
	/** OpenAPI path, with {param} placeholders. */
	path: string;
	operationId: string;
	tag: 'Assets' | 'Intake' | 'Research' | 'Populations' | 'Documentation';
	summary: string;
	description?: string;
	/** The policy action the route asks for; the test picks a demo role that has it. */
	action: Action | null;
	params?: z.ZodObject;
	query?: z.ZodObject;
	/** A JSON request body, validated by this schema in the route. */
	body?: z.ZodType;
	file?: FileBody;
	/** An example body for the test. */
	exampleBody?: unknown;
	/** An example query string for the test, without '?'. */
	exampleQuery?: string;
	response: {
		/** 200 unless given: 201 created, 202 accepted (runs on), 204 nothing to say. */
		status?: 200 | 201 | 202 | 204;
		/** Absent for 204. */
		mediaType?: MediaType;
		schema?: z.ZodType;
		description: string;
	};
	/** Response headers worth documenting (name → description). */
	headers?: Record<string, string>;
	/** What this operation's own errors mean, added to or replacing the common wording. */
	errors?: Partial<Record<ErrorStatus, string>>;
}

/** A JSON answer of `schema`. */
export const jsonAnswer = (schema: z.ZodType, description: string, status: 200 | 201 | 202 = 200) =>
	({ status, mediaType: 'application/json', schema, description }) as const;

/** The path parameter `{<name>Id}` of a record. */
export const recordParams = (name: string, described = name) =>
	z.object({ [`${name}Id`]: idParam(described) });
