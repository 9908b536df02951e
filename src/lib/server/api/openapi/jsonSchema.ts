import { z } from 'zod';

/**
 * zod → JSON Schema (2020-12, which OpenAPI 3.1 uses as is) with zod's built-in converter.
 * Named schemas (.meta({ id })) come out under $defs; they are moved into the document's
 * components and the references rewritten, so each named shape is written once.
 */
export type JsonSchema = Record<string, unknown>;

export function toOpenApiSchema(
	schema: z.ZodType,
	io: 'input' | 'output',
	components: Record<string, JsonSchema>
): JsonSchema {
	const converted = z.toJSONSchema(schema, {
		io,
		unrepresentable: 'any',
		override: ({ jsonSchema }) => {
			// zod spells a date's or a time's format out again as a long regex; the format says it.
			if (jsonSchema.format === 'date' || jsonSchema.format === 'date-time') {
				delete jsonSchema.pattern;
			}
		}
	}) as JsonSchema;
	delete converted.$schema;
	const defs = (converted.$defs ?? {}) as Record<string, JsonSchema>;
	delete converted.$defs;
	for (const [name, def] of Object.entries(defs)) components[name] = rewriteRefs(def);
	return rewriteRefs(converted);
}

function rewriteRefs(schema: JsonSchema): JsonSchema {
	return JSON.parse(
		JSON.stringify(schema).replaceAll('"#/$defs/', '"#/components/schemas/')
	) as JsonSchema;
}
