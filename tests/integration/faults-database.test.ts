import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { faultDatabase } from '../helpers/faultDatabase';
import { startBuiltApp } from '../helpers/server';
import { signInAs, type HttpClient } from '../helpers/session';

// Timeouts the app is configured with (docs/scaling.md): connect 5 s, pool acquire 10 s. A request
// may wait for at most those before it is answered; we allow a little more for the machine.
const LONGEST_WAIT_MS = 5_000 + 10_000 + 3_000;

async function timed(request: () => Promise<Response>) {
	const started = Date.now();
	try {
		const response = await request();
		await response.arrayBuffer();
		return { status: response.status, ms: Date.now() - started };
	} catch {
		return { status: 0, ms: Date.now() - started };
	}
}

async function until(check: () => Promise<boolean>, timeoutMs: number): Promise<void> {
	const deadline = Date.now() + timeoutMs;
	while (!(await check())) {
		if (Date.now() > deadline) throw new Error(`not true within ${timeoutMs} ms`);
		await new Promise((r) => setTimeout(r, 250));
	}
}

describe('when MariaDB goes away under a running app', () => {
	let app: Awaited<ReturnType<typeof startBuiltApp>>;
	let engineer: HttpClient;

	beforeAll(async () => {
		const env = await faultDatabase.prepare();
		app = await startBuiltApp({ ...env, DB_CONNECT_TIMEOUT_MS: '2000' });
		engineer = await signInAs('engineer', app.origin);
	});

	afterAll(async () => {
		await app?.stop();
		faultDatabase.stop();
	});

	it('answers a clear 503 page while it is down and recovers without a restart', async () => {
		expect((await engineer.get('/dashboard')).status).toBe(200);
		faultDatabase.stop();

		const page = await engineer.get('/dashboard');
		expect(page.status).toBe(503);
		expect(page.headers.get('retry-after')).toBe('30');
		const html = await page.text();
		expect(html).toContain('cannot reach its database');
		expect(html).not.toMatch(/ECONNREFUSED|SqlError|at .*\.js/);

		const api = await engineer.get('/api/v1/me', { accept: 'application/json' });
		expect(api.status).toBe(503);
		expect((await api.json()).error.code).toBe('unavailable');

		faultDatabase.start();
		// The same process, the same session: the pool reconnects by itself.
		await until(async () => (await engineer.get('/dashboard')).status === 200, 20_000);
		expect(app.output()).not.toContain('Unhandled');
	});

	it('keeps every request within its timeout while MariaDB restarts under load', async () => {
		let running = true;
		const results: { status: number; ms: number }[] = [];
		const worker = async () => {
			while (running) {
				results.push(await timed(() => engineer.get('/api/v1/me', { accept: 'application/json' })));
			}
		};
		const workers = Array.from({ length: 8 }, worker);
		await new Promise((r) => setTimeout(r, 500));
		faultDatabase.stop();
		await new Promise((r) => setTimeout(r, 1_500));
		faultDatabase.start();
		await until(async () => results.slice(-8).every((r) => r.status === 200), 20_000);
		running = false;
		await Promise.all(workers);

		expect(results.length).toBeGreaterThan(16);
		expect(Math.max(...results.map((r) => r.ms))).toBeLessThan(LONGEST_WAIT_MS);
		// Every answer was either served or a clean 503: never a hang, a crash or a 500.
		expect(results.every((r) => r.status === 200 || r.status === 503)).toBe(true);
		expect(results.some((r) => r.status === 503)).toBe(true);
	});
});
