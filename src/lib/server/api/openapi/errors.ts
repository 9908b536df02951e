import type { Endpoint } from './endpoint';

/**
 * The error answers an operation documents: the ones its kind always can give (401 and 403 when
 * it needs a right, 404 when it names a record, 400 when it takes input), then its own. All have
 * the one error body (`Error`), as src/lib/server/web/http.ts makes every /api failure.
 */
const COMMON = {
	'400': 'Invalid input: `field` names the body field, query or path parameter at fault.',
	'401': 'No valid token or session.',
	'403': 'Your role does not allow this.',
	'404': "Not found, or another organisation's record (never 403, so ids reveal nothing).",
	'413': 'The body is larger than this server accepts (BODY_SIZE_LIMIT).',
	'429': 'Too many requests; see Retry-After.'
} as const;

/** What a write on a submitted or approved survey answers (src/lib/server/intake/frozen.ts). */
export const FROZEN =
	'The survey is submitted or approved: its records are frozen until an engineer returns it.';

/** The one write of another organisation's asset shared with yours: it is read-only. */
export const READ_ONLY =
	'Your role does not allow this, or the asset is shared with you read-only.';

function commonStatuses(endpoint: Endpoint): (keyof typeof COMMON)[] {
	const takesInput = Boolean(endpoint.params || endpoint.query || endpoint.body || endpoint.file);
	return [
		...(takesInput ? (['400'] as const) : []),
		...(endpoint.action ? (['401', '403'] as const) : []),
		...(endpoint.params ? (['404'] as const) : []),
		...(endpoint.body ? (['413'] as const) : []),
		'429'
	];
}

/** Status → description of every error answer `endpoint` can give, in status order. */
export function errorStatuses(endpoint: Endpoint): Record<string, string> {
	const statuses: Record<string, string> = {};
	for (const status of commonStatuses(endpoint)) statuses[status] = COMMON[status];
	Object.assign(statuses, endpoint.errors);
	return Object.fromEntries(Object.entries(statuses).sort(([a], [b]) => Number(a) - Number(b)));
}

export function errorResponses(endpoint: Endpoint) {
	return Object.fromEntries(
		Object.entries(errorStatuses(endpoint)).map(([status, text]) => [
			status,
			{
				description: text,
				content: { 'application/json': { schema: { $ref: '#/components/schemas/Error' } } }
			}
		])
	);
}
