/** Socket errors that mean "no storage service to talk to", not "this request was wrong". */
const NETWORK_CODES = new Set([
	'ECONNREFUSED',
	'ECONNRESET',
	'ECONNABORTED',
	'EPIPE',
	'ETIMEDOUT',
	'EHOSTUNREACH',
	'ENETUNREACH',
	'ENOTFOUND',
	'EAI_AGAIN'
]);

interface SdkErrorShape {
	name?: string;
	code?: string;
	errors?: unknown[];
	$metadata?: { httpStatusCode?: number };
}

/**
 * True when an S3 client error says the service is down or hung: a socket error, the client's
 * own connect or request timeout (the SDK names it TimeoutError), or a 5xx answer (S3's
 * ServiceUnavailable, SlowDown, InternalError). A 4xx (a missing bucket, bad keys) is a
 * misconfiguration, not an outage, and stays a 500.
 */
export function isStorageUnreachable(err: unknown): boolean {
	const e = (err ?? {}) as SdkErrorShape;
	if (e.name === 'TimeoutError') return true;
	if (e.code && NETWORK_CODES.has(e.code)) return true;
	// Node reports a failed connect to several addresses (IPv6 and IPv4) as an AggregateError.
	if (Array.isArray(e.errors) && e.errors.some(isStorageUnreachable)) return true;
	const status = e.$metadata?.httpStatusCode;
	return status !== undefined && status >= 500;
}
