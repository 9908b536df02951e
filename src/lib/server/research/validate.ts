import type { z } from 'zod';

/** A zod failure as one message naming the field, for the API's { error: { field } } body. */
export class InvalidInputError extends Error {
	constructor(
		message: string,
		readonly field: string | undefined
	) {
		super(message);
	}
}

/** Parses `input` with `schema`, or throws InvalidInputError naming the first bad field. */
export function parseOrThrow<S extends z.ZodType>(schema: S, input: unknown): z.infer<S> {
	const parsed = schema.safeParse(input);
	if (parsed.success) return parsed.data;
	const issue = parsed.error.issues[0];
	const field = issue.path.length ? issue.path.map(String).join('.') : undefined;
	// A list field's path ends in the index: name the field, and say which entry.
	const named = field ? `${field}: ${issue.message}` : issue.message;
	throw new InvalidInputError(named, field?.replace(/\.\d+$/, ''));
}
