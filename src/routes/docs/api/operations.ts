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
