import { describe, expect, it } from 'vitest';
import { codeForStatus, toApiErrorResponse } from '$lib/server/web/http';

describe('toApiErrorResponse', () => {
	it('rewrites SvelteKit’s { message } into { error: { code, message } }', async () => {
		const kit = new Response(JSON.stringify({ message: 'Sign in to continue.' }), {
			status: 401,
			headers: { 'content-type': 'application/json' }
		});
		const body = await (await toApiErrorResponse(kit)).json();
		expect(body).toEqual({ error: { code: 'unauthenticated', message: 'Sign in to continue.' } });
	});

	it('keeps a code and field given with error(), and turns an HTML error page into JSON', async () => {
		const coded = new Response(
			JSON.stringify({ message: 'Bad', code: 'invalid_input', field: 'name' }),
			{
				status: 400
			}
		);
		expect((await (await toApiErrorResponse(coded)).json()).error).toEqual({
			code: 'invalid_input',
			message: 'Bad',
			field: 'name'
		});
		const html = new Response('<html>404</html>', {
			status: 404,
			headers: { 'content-type': 'text/html' }
		});
		const rewritten = await toApiErrorResponse(html);
		expect(rewritten.headers.get('content-type')).toBe('application/json');
		expect((await rewritten.json()).error.code).toBe('not_found');
	});

	it('leaves successes and a route’s own error report alone', async () => {
		const ok = new Response('{"a":1}', { status: 200 });
		expect(await toApiErrorResponse(ok)).toBe(ok);
		const health = new Response(JSON.stringify({ status: 'degraded', database: { up: false } }), {
			status: 503
		});
		expect(await (await toApiErrorResponse(health)).json()).toEqual({
			status: 'degraded',
			database: { up: false }
		});
	});

	it('names unknown statuses plainly', () => {
		expect(codeForStatus(500)).toBe('server_error');
		expect(codeForStatus(418)).toBe('error');
	});
});
