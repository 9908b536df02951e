import type { z } from 'zod';
import { apiError } from './http';
import { InvalidInputError, parseOrThrow } from '../research/validate';

/** Single-valued query parameters as a plain object (the last value of a repeated key wins). */
export function queryObject(url: URL): Record<string, string> {
	return Object.fromEntries(url.searchParams.entries());
}

/**
 * The one reader of query strings: values through zod, and a bad one is a 400 whose body names
 * the parameter ({ error: { code: 'invalid_input', message, field } }); a list's entry is named
 * by its list (research/validate.ts words the message).
 */
export function readQuery<S extends z.ZodType>(schema: S, input: unknown): z.infer<S> {
	try {
		return parseOrThrow(schema, input);
	} catch (e) {
		if (e instanceof InvalidInputError) apiError(400, 'invalid_input', e.message, e.field);
		throw e;
	}
}
