import { spawn, type ChildProcess } from 'node:child_process';
import { createServer } from 'node:net';

/** A free TCP port on 127.0.0.1, asked of the kernel. */
export function freePort(): Promise<number> {
	return new Promise((resolve, reject) => {
		const server = createServer();
		server.once('error', reject);
		server.listen(0, '127.0.0.1', () => {
			const address = server.address();
			server.close(() => resolve(typeof address === 'object' && address ? address.port : 0));
		});
	});
}

/**
 * Starts another copy of the built app (./build) with the test environment plus `overrides`,
 * for tests that need an app in a state of its own (a database that is down, say).
 */
export async function startBuiltApp(overrides: Record<string, string>) {
	const port = await freePort();
	const origin = `http://127.0.0.1:${port}`;
	const child: ChildProcess = spawn(process.execPath, ['build'], {
		env: { ...process.env, ...overrides, PORT: String(port), HOST: '127.0.0.1', ORIGIN: origin },
		stdio: ['ignore', 'pipe', 'pipe']
	});
	let output = '';
	child.stdout?.on('data', (d) => (output += d));
	child.stderr?.on('data', (d) => (output += d));
	const deadline = Date.now() + 20_000;
	while (Date.now() < deadline) {
		try {
			await fetch(origin, { method: 'HEAD' });
			break;
		} catch {
			if (child.exitCode !== null) throw new Error(`the app exited early:\n${output}`);
			await new Promise((r) => setTimeout(r, 150));
		}
	}
	return {
		origin,
		/** The app's process id, to read its memory from /proc. */
		pid: child.pid!,
		output: () => output,
		/** Ends the process at once with `signal` (SIGKILL: no shutdown code runs), as a crash would. */
		async kill(signal: NodeJS.Signals = 'SIGKILL') {
			if (child.exitCode !== null || child.signalCode !== null) return;
			const exited = new Promise((r) => child.once('exit', r));
			child.kill(signal);
			await exited;
		},
		async stop() {
			if (child.exitCode === null && child.signalCode === null) {
				child.kill('SIGTERM');
				// A graceful stop that has not come within 15 s is forced: a test never hangs on it.
				const forced = setTimeout(() => child.kill('SIGKILL'), 15_000);
				await new Promise((r) => child.once('exit', r));
				clearTimeout(forced);
			}
		}
	};
}
