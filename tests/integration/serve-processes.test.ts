/**
 * scripts/serve.mjs: the built app as several processes on one port. Any worker answers, a
 * worker that dies is replaced, and SIGTERM ends them all (docs/scaling.md).
 */
import { spawn } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { get } from 'node:http';
import { afterAll, describe, expect, it } from 'vitest';
import { freePort } from '../helpers/server';
import { until } from '../helpers/until';

/** Child process ids of `pid`, from /proc (Linux). */
function childrenOf(pid: number): number[] {
	try {
		const text = readFileSync(`/proc/${pid}/task/${pid}/children`, 'utf8').trim();
		return text ? text.split(/\s+/).map(Number) : [];
	} catch {
		return [];
	}
}

describe('the built app as several processes (scripts/serve.mjs)', () => {
	let primary: ReturnType<typeof spawn> | null = null;
	afterAll(() => {
		primary?.kill('SIGKILL');
	});

	it('serves with two workers, replaces one that is killed, and stops on SIGTERM', async () => {
		const port = await freePort();
		const origin = `http://127.0.0.1:${port}`;
		primary = spawn(process.execPath, ['scripts/serve.mjs'], {
			env: { ...process.env, WEB_CONCURRENCY: '2', PORT: String(port), ORIGIN: origin },
			stdio: 'ignore'
		});
		// A new connection for each request: fetch would reuse a kept-alive socket, and one held by
		// the worker killed below dies with it, which says nothing about the workers serving.
		const health = () =>
			new Promise<number | undefined>((resolve) => {
				get(`${origin}/api/health`, { agent: false }, (response) => {
					response.resume();
					resolve(response.statusCode);
				}).on('error', () => resolve(undefined));
			});
		await until('the app answers', async () => (await health()) === 200);
		const workers = await until('two workers', async () => {
			const pids = childrenOf(primary!.pid!);
			return pids.length === 2 ? pids : null;
		});

		process.kill(workers[0], 'SIGKILL');
		await until('a replacement worker', async () => {
			const pids = childrenOf(primary!.pid!);
			return pids.length === 2 && !pids.includes(workers[0]);
		});
		// A connection the primary handed out in the moment of the kill may still fail (once seen
		// in a full run); from then on every request is answered.
		await until('serving after the replacement', async () => (await health()) === 200);
		for (let i = 0; i < 6; i++) expect(await health()).toBe(200);

		const exited = new Promise<number | null>((r) => primary!.once('exit', (code) => r(code)));
		primary.kill('SIGTERM');
		expect(await exited).toBe(0);
		// The surviving first-generation worker is gone too (signal 0 only asks whether it exists).
		expect(() => process.kill(workers[1], 0)).toThrow();
		expect(await health()).toBeUndefined();
	});
});
