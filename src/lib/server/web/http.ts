import { error, json } from '@sveltejs/kit';
import type { z } from 'zod';

/**
 * The one error shape of every /api route: `{ error: { code, message, field? } }`.
 *
 * How it comes about: routes either `throw apiError(...)` (or call `error()`, as policy.ts does),
 * and hooks.server.ts hands every failed /api response to `toApiErrorResponse`, which rewrites
 * SvelteKit's own error bodies (`{ message, code?, field? }` or its HTML error page) into this
 * shape. So a route cannot answer an error in any other form, even one it did not foresee.
 */
export interface ApiErrorBody {
	error: { code: string; message: string; field?: string; errorId?: string };
}

const CODE_FOR_STATUS: Record<number, string> = {
	400: 'invalid_input',
	401: 'unauthenticated',
	403: 'forbidden',
	404: 'not_found',
	405: 'method_not_allowed',
	409: 'conflict',
	410: 'gone',
	413: 'too_large',
	415: 'unsupported_media_type',
	429: 'too_many_requests',
	503: 'unavailable'
};

const DEFAULT_MESSAGE: Record<number, string> = {
	401: 'Sign in, or send a valid API token as "Authorization: Bearer <token>".',
	403: 'Your role does not allow this.',
	404: 'Not found.',
	405: 'This method is not allowed here.'
};

export function codeForStatus(status: number): string {
	return CODE_FOR_STATUS[status] ?? (status >= 500 ? 'server_error' : 'error');
}

/** Throws an API error with a stable code (and the offending field, for bad input). */
export function apiError(status: number, code: string, message: string, field?: string): never {
	error(status, { message, code, field });
}

/** Validates a JSON body; a body that is not JSON or breaks the schema is a 400 naming the field. */
export async function readJson<S extends z.ZodType>(request: Request, schema: S) {
	const text = await bodyText(request);
	let body: unknown;
	try {
		body = JSON.parse(text);
	} catch {
		apiError(400, 'invalid_json', 'The request body is not valid JSON.');
	}
	const parsed = schema.safeParse(body);
	if (!parsed.success) {
		const issue = parsed.error.issues[0];
		const field = issue.path.length ? issue.path.join('.') : undefined;
		apiError(400, 'invalid_input', issue.message, field);
	}
	return parsed.data as z.infer<S>;
}

/**
 * The body as text. A body over BODY_SIZE_LIMIT fails while it is read (adapter-node errors
 * the stream with status 413): say so, rather than calling it invalid JSON.
 */
async function bodyText(request: Request): Promise<string> {
	try {
		return await request.text();
	} catch (err) {
		if ((err as { status?: number }).status === 413) {
			apiError(413, 'too_large', 'The request body is larger than this server accepts.');
		}
		throw err;
	}
}

/** Rewrites a failed /api response into the ApiErrorBody shape; leaves ours as they are. */
export async function toApiErrorResponse(response: Response): Promise<Response> {
	if (response.status < 400) return response;
	const text = await response.text();
	const parsed = parseJson(text);
	if (parsed !== null && !isKitErrorBody(parsed)) {
		// Already ours, or a route's own deliberate body (/api/health's 503 report).
		return new Response(text, { status: response.status, headers: response.headers });
	}
	const kitBody = (parsed ?? {}) as {
		message?: string;
		code?: string;
		field?: string;
		errorId?: string;
	};
	const body: ApiErrorBody = {
		error: {
			code: kitBody.code ?? codeForStatus(response.status),
			message: kitBody.message ?? DEFAULT_MESSAGE[response.status] ?? 'The request failed.',
			...(kitBody.field ? { field: kitBody.field } : {}),
			...(kitBody.errorId ? { errorId: kitBody.errorId } : {})
		}
	};
	const headers = new Headers(response.headers);
	headers.delete('content-length');
	headers.set('content-type', 'application/json');
	return json(body, { status: response.status, headers });
}

/** SvelteKit's error JSON is App.Error: `message` and our optional extras, nothing else. */
const KIT_ERROR_KEYS = new Set(['message', 'code', 'field', 'errorId']);
function isKitErrorBody(body: unknown): boolean {
	return (
		typeof body === 'object' &&
		body !== null &&
		'message' in body &&
		Object.keys(body).every((key) => KIT_ERROR_KEYS.has(key))
	);
}

function parseJson(text: string): unknown {
	try {
		return JSON.parse(text);
	} catch {
		return null;
	}
}
