import type { z } from 'zod';

/**
 * A saved record as its edit form shows it: every field of `schema` as text, '' where the record
 * has none, so that saving an untouched form posts back what was there and changes nothing.
 */
export function formValuesOf(record: object, schema: z.ZodObject): Record<string, string> {
	const values: Record<string, string> = {};
	for (const field of Object.keys(schema.shape)) {
		const value = (record as Record<string, unknown>)[field];
		values[field] = value == null ? '' : String(value);
	}
	return values;
}
