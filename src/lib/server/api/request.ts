import type { z } from 'zod';
import { apiError } from '../web/http';
import { InvalidInputError, parseOrThrow } from '../research/validate';

/**
 * Query strings and path parameters through zod, every one: a bad value is a 400 whose body
 * names the field ({ error: { code: 'invalid_input', message, field } }).
 */
export function parseInput<S extends z.ZodType>(schema: S, input: unknown): z.infer<S> {
	try {
		return parseOrThrow(schema, input);
	} catch (e) {
		if (e instanceof InvalidInputError) apiError(400, 'invalid_input', e.message, e.field);
		throw e;
	}
}

/** Single-valued query parameters as a plain object (the last value wins). */
export function queryObject(url: URL): Record<string, string> {
	return Object.fromEntries(url.searchParams.entries());
}
