import { fail, type ActionFailure } from '@sveltejs/kit';
import type { z } from 'zod';

export type FieldErrors = Record<string, string>;

/** What a failed form hands back to its page: one message per field and the safe values. */
export interface FormFailure {
	errors: FieldErrors;
	values: Record<string, string>;
	message?: string;
}

/** Fields whose content is never sent back to the browser. */
const SECRET_FIELD = /password|token|secret/i;

/** The posted fields as strings, with secrets left out, for re-filling a form. */
export function safeValues(form: FormData): Record<string, string> {
	const values: Record<string, string> = {};
	for (const [name, value] of form.entries()) {
		if (typeof value === 'string' && !SECRET_FIELD.test(name)) values[name] = value;
	}
	return values;
}

/** The first zod message for each field. */
export function fieldErrors(error: z.ZodError): FieldErrors {
	const errors: FieldErrors = {};
	for (const issue of error.issues) {
		const field = String(issue.path[0] ?? 'form');
		errors[field] ??= issue.message;
	}
	return errors;
}

export type ParsedForm<T> =
	{ ok: true; data: T; form: FormData } | { ok: false; failure: ActionFailure<FormFailure> };

/** Reads a form post and validates it; on failure, the `fail(400)` to return as it is. */
export async function parseForm<S extends z.ZodType>(
	request: Request,
	schema: S
): Promise<ParsedForm<z.infer<S>>> {
	const form = await request.formData();
	const parsed = schema.safeParse(Object.fromEntries(form));
	if (parsed.success) return { ok: true, data: parsed.data, form };
	return {
		ok: false,
		failure: fail(400, { errors: fieldErrors(parsed.error), values: safeValues(form) })
	};
}

/** A failure that is about the form as a whole (wrong password, link used), not one field. */
export function formMessage(
	status: number,
	form: FormData,
	message: string,
	errors: FieldErrors = {}
): ActionFailure<FormFailure> {
	return fail(status, { errors, values: safeValues(form), message });
}
