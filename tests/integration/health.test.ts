import { describe, expect, it } from 'vitest';
import { appUrl } from '../helpers/env';
import { freePort, startBuiltApp } from '../helpers/server';

describe('GET /api/health', () => {
	it('reports the database up with its latency', async () => {
		const response = await fetch(`${appUrl()}/api/health`);
		expect(response.status).toBe(200);
		const body = await response.json();
		expect(body.status).toBe('ok');
		expect(body.database.up).toBe(true);
		expect(body.database.latencyMs).toBeGreaterThanOrEqual(0);
	});

	it('answers 503 with a reason, and keeps serving, when the database is down', async () => {
		// A port where no database listens: the same as a stopped MariaDB to the app.
		const deadPort = await freePort();
		const app = await startBuiltApp({ DB_PORT: String(deadPort), DB_CONNECT_TIMEOUT_MS: '1000' });
		try {
			const response = await fetch(`${app.origin}/api/health`);
			expect(response.status).toBe(503);
			const body = await response.json();
			expect(body.database.up).toBe(false);
			expect(body.database.reason).toMatch(/refuses connections|did not answer|unavailable/);
			expect(body.error.code).toBe('unavailable');
			// No credentials or internals leak into the answer.
			expect(JSON.stringify(body)).not.toContain(process.env.DB_PASSWORD!);
			// The process is still up and serving other pages.
			const landing = await fetch(`${app.origin}/`);
			expect(landing.status).toBe(200);
		} finally {
			await app.stop();
		}
	});
});
