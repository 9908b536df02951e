/**
 * The OpenAPI document's operations as the reference page lists them: what each takes (path and
 * query parameters, a JSON or file body) and what it answers, with its error statuses.
 */
interface Operation {
	operationId: string;
	summary: string;
	description?: string;
	tags: string[];
	parameters: { name: string; in: string; description?: string; schema: { type?: unknown } }[];
	requestBody?: { description?: string; content: Record<string, { schema?: { $ref?: string } }> };
	responses: Record<
		string,
		{ description: string; content?: Record<string, { schema?: { $ref?: string } }> }
	>;
}

const schemaName = (schema?: { $ref?: string }) => schema?.$ref?.split('/').pop() ?? null;

function typeOf(schema: { type?: unknown }): string {
	return Array.isArray(schema.type) ? schema.type.join(' | ') : String(schema.type ?? 'string');
}

function body(op: Operation) {
	if (!op.requestBody) return null;
	const mediaTypes = Object.keys(op.requestBody.content);
	const json = op.requestBody.content['application/json'];
	return json
		? { text: 'JSON', schemaName: schemaName(json.schema) }
		: { text: `a file (${mediaTypes.join(', ')})`, schemaName: null };
}

function answer(op: Operation) {
	const [status, response] = Object.entries(op.responses).find(([s]) => s.startsWith('2'))!;
	const [mediaType, media] = Object.entries(response.content ?? {})[0] ?? [null, undefined];
	const errors = Object.keys(op.responses).filter((s) => !s.startsWith('2'));
	return { status, mediaType, schemaName: schemaName(media?.schema), errors };
}

export function operationsOf(paths: Record<string, Record<string, unknown>>) {
	return Object.entries(paths).flatMap(([path, methods]) =>
		Object.entries(methods).map(([method, raw]) => {
			const op = raw as Operation;
			return {
				id: op.operationId,
				method: method.toUpperCase(),
				path,
				summary: op.summary,
				description: op.description ?? '',
				tag: op.tags[0],
				parameters: op.parameters.map((p) => ({
					name: p.name,
					in: p.in,
					type: typeOf(p.schema),
					description: p.description ?? ''
				})),
				body: body(op),
				answer: answer(op)
			};
		})
	);
}

/** A JSON schema as the OpenAPI document writes it (the parts the reference shows). */
interface JsonSchema {
	type?: string | string[];
	$ref?: string;
	enum?: unknown[];
	anyOf?: JsonSchema[];
	items?: JsonSchema;
	properties?: Record<string, JsonSchema>;
	required?: string[];
	description?: string;
}

/** "string", "integer | null", "one of mm, inch", "SurveyRecord", "list of Reading"… */
function schemaType(schema: JsonSchema): string {
	if (schema.$ref) return schemaName(schema) ?? 'object';
	if (schema.enum) return `one of ${schema.enum.map(String).join(', ')}`;
	if (schema.anyOf) return schema.anyOf.map(schemaType).join(' | ');
	const types = Array.isArray(schema.type) ? schema.type : [schema.type ?? 'object'];
	return types.map((t) => (t === 'array' && schema.items ? `list of ${schemaType(schema.items)}` : t)).join(' | ');
}

export interface SchemaField {
	name: string;
	type: string;
	required: boolean;
	description: string;
}

/**
 * The named schemas as field tables, so a body or an answer named on the page is also shown
 * there (nested objects one level down, as "parent.child").
 */
export function schemaTables(schemas: Record<string, JsonSchema>): Record<string, SchemaField[]> {
	const fieldsOf = (schema: JsonSchema, prefix = ''): SchemaField[] =>
		Object.entries(schema.properties ?? {}).flatMap(([name, field]) => {
			const row = {
				name: prefix + name,
				type: schemaType(field),
				required: (schema.required ?? []).includes(name),
				description: field.description ?? ''
			};
			return field.properties && !prefix ? [row, ...fieldsOf(field, `${name}.`)] : [row];
		});
	return Object.fromEntries(Object.entries(schemas).map(([name, s]) => [name, fieldsOf(s)]));
}

/** Text with `code` in backticks, as parts to print: code parts in a code face, never raw ticks. */
export function withCode(text: string): { text: string; code: boolean }[] {
	return text
		.split('`')
		.map((part, i) => ({ text: part, code: i % 2 === 1 }))
		.filter((part) => part.text !== '');
}
