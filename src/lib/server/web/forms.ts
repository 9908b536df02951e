import { fail, type ActionFailure } from '@sveltejs/kit';
import type { z } from 'zod';

export type FieldErrors = Record<string, string>;

/** What a failed form hands back to its page: one message per field and the safe values. */
export interface FormFailure {
	errors: FieldErrors;
	values: Record<string, string>;
	message?: string;
}

/** Fields whose content is never sent back to the browser ("password", "newPassword", "pwd"...). */
const SECRET_FIELD = /pass|pwd|token|secret/i;

/**
 * The posted fields as strings, for re-filling a form: never a secret field, never a value that
 * repeats a secret (a "type it again" box under any name), and, when `fields` is given, only
 * those (the schema's own fields: whatever else was posted is not ours to echo).
 */
export function safeValues(form: FormData, fields?: readonly string[]): Record<string, string> {
	const secrets = new Set<string>();
	for (const [name, value] of form.entries()) {
		if (typeof value === 'string' && value !== '' && SECRET_FIELD.test(name)) secrets.add(value);
	}
	const values: Record<string, string> = {};
	for (const [name, value] of form.entries()) {
		if (typeof value !== 'string' || SECRET_FIELD.test(name) || secrets.has(value)) continue;
		if (fields && !fields.includes(name)) continue;
		values[name] = value;
	}
	return values;
}

/** The field names a form schema declares (an object schema), or undefined for any other. */
function schemaFields(schema: z.ZodType): readonly string[] | undefined {
	const shape = (schema as { shape?: unknown }).shape;
	return shape && typeof shape === 'object' ? Object.keys(shape) : undefined;
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
	| { ok: true; data: T; form: FormData; values: Record<string, string> }
	| { ok: false; failure: ActionFailure<FormFailure> };

/** Reads a form post and validates it; on failure, the `fail(400)` to return as it is. */
export async function parseForm<S extends z.ZodType>(
	request: Request,
	schema: S
): Promise<ParsedForm<z.infer<S>>> {
	const form = await request.formData();
	const parsed = schema.safeParse(Object.fromEntries(form));
	const values = safeValues(form, schemaFields(schema));
	if (parsed.success) return { ok: true, data: parsed.data, form, values };
	return { ok: false, failure: fail(400, { errors: fieldErrors(parsed.error), values }) };
}

/**
 * A failure that is about the form as a whole (wrong password, link used), not one field. Pass
 * `parsed.values` where there is one (only the schema's fields), else the form itself.
 */
export function formMessage(
	status: number,
	form: FormData | Record<string, string>,
	message: string,
	errors: FieldErrors = {}
): ActionFailure<FormFailure> {
	const values = form instanceof FormData ? safeValues(form) : form;
	return fail(status, { errors, values, message });
}
