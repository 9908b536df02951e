import { BaseError, ConnectionError } from 'sequelize';

/** mariadb connector codes that mean "no database to talk to", not "this query was wrong". */
const CONNECTION_CODES = new Set([
	'ECONNREFUSED',
	'ECONNRESET',
	'ETIMEDOUT',
	'EPIPE',
	'ER_SOCKET_UNEXPECTED_CLOSE',
	'ER_CONNECTION_TIMEOUT',
	'ER_GET_CONNECTION_TIMEOUT',
	'ER_CONNECTION_ALREADY_CLOSED',
	'ER_CMD_CONNECTION_CLOSED',
	'ER_SERVER_SHUTDOWN',
	// A Galera node without quorum (errno 1047) refuses every query until the cluster is whole.
	'ER_UNKNOWN_COM_ERROR'
]);

/** An error raised by the database layer: one of Sequelize's, or the mariadb connector's. */
function fromDatabaseLayer(err: unknown): boolean {
	return err instanceof BaseError || (err as { name?: string }).name === 'SqlError';
}

/**
 * True when an error says the database cannot be reached (refused, closed, timed out, shutting
 * down): the request then answers 503 and the pool reconnects by itself once MariaDB is back.
 * A connection code counts only under an error of the database layer: object storage or mail
 * refusing a connection raises the same ECONNREFUSED, and is not the database being down.
 */
export function isDatabaseUnavailable(err: unknown): boolean {
	if (err instanceof ConnectionError) return true;
	let underDatabase = false;
	for (let e: unknown = err, depth = 0; e && depth < 4; depth++) {
		underDatabase ||= fromDatabaseLayer(e);
		if (underDatabase) {
			const code = (e as { code?: string }).code;
			if (code && CONNECTION_CODES.has(code)) return true;
			if ((e as { fatal?: boolean }).fatal === true) return true;
		}
		e =
			(e as { parent?: unknown; original?: unknown; cause?: unknown }).parent ??
			(e as { original?: unknown }).original ??
			(e as { cause?: unknown }).cause;
	}
	return false;
}

const MESSAGE =
	'Fractile cannot reach its database right now. Nothing you entered has been half-saved: try again in a minute.';

/** The 503 answer: a plain page for people, the /api error shape for programs. */
export function databaseUnavailableResponse(pathname: string): Response {
	const headers = { 'retry-after': '30', 'cache-control': 'no-store' };
	if (pathname.startsWith('/api/')) {
		return Response.json(
			{ error: { code: 'unavailable', message: MESSAGE } },
			{ status: 503, headers }
		);
	}
	return new Response(unavailablePage(), {
		status: 503,
		headers: { ...headers, 'content-type': 'text/html; charset=utf-8' }
	});
}

function unavailablePage(): string {
	return `<!doctype html>
<html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1">
<title>Fractile is unavailable</title>
<style>body{font-family:Inter,system-ui,sans-serif;background:#f6f7f7;color:#24292b;margin:0}
main{max-width:36rem;margin:10vh auto;padding:2rem;background:#fff;border:1px solid #d7dbdc;border-radius:.5rem}
h1{font-size:1.4rem;color:#1d4c49;margin-top:0}</style></head>
<body><main><h1>Fractile is briefly unavailable</h1><p>${MESSAGE}</p>
<p>This page will work again by itself as soon as the database answers; there is no need to sign in again.</p>
</main></body></html>`;
}
