import { spawn, type ChildProcess } from 'node:child_process';
import { mkdtemp, rm } from 'node:fs/promises';
import { connect, createServer, type Socket } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { ListObjectsV2Command, S3Client } from '@aws-sdk/client-s3';
import { freePort } from './server';
import { until } from './until';

/** Every object key under `prefix` in the bucket at `endpoint` (the suite's fake unless told). */
export async function storedKeys(
	prefix: string,
	endpoint = process.env.S3_ENDPOINT
): Promise<string[]> {
	const client = new S3Client({
		endpoint,
		region: process.env.S3_REGION ?? 'us-east-1',
		forcePathStyle: true,
		credentials: {
			accessKeyId: process.env.S3_ACCESS_KEY_ID ?? 'S3RVER',
			secretAccessKey: process.env.S3_SECRET_ACCESS_KEY ?? 'S3RVER'
		}
	});
	try {
		const listed = await client.send(
			new ListObjectsV2Command({ Bucket: process.env.S3_BUCKET ?? 'fractile', Prefix: prefix })
		);
		return (listed.Contents ?? []).map((o) => o.Key!).sort();
	} finally {
		client.destroy();
	}
}

function answers(port: number): Promise<boolean> {
	return new Promise((resolve) => {
		const socket = connect(port, '127.0.0.1');
		const done = (up: boolean) => {
			socket.destroy();
			resolve(up);
		};
		socket.once('connect', () => done(true));
		socket.once('error', () => done(false));
	});
}

/**
 * A storage fake of the test's own (scripts/fakes/storage.ts in a child process) on a free port
 * and a folder of its own, so a test can stop and start it without touching the suite's shared
 * fake. Stopping ends the process, which closes every socket the app holds to it.
 */
export async function ownStorageFake() {
	const port = await freePort();
	const dir = await mkdtemp(join(tmpdir(), 'fractile-s3-fault-'));
	const endpoint = `http://127.0.0.1:${port}`;
	let child: ChildProcess | null = null;
	return {
		endpoint,
		async start(): Promise<void> {
			child = spawn(process.execPath, ['--import', 'tsx', 'scripts/fakes/storage.ts'], {
				env: { ...process.env, S3_FAKE_PORT: String(port), S3_FAKE_DIR: dir },
				stdio: 'ignore'
			});
			await until(`the storage fake on ${port}`, () => answers(port), 20_000, 100);
		},
		async stop(): Promise<void> {
			const running = child;
			child = null;
			if (!running || running.exitCode !== null) return;
			const exited = new Promise((r) => running.once('exit', r));
			running.kill('SIGTERM');
			const forced = setTimeout(() => running.kill('SIGKILL'), 5_000);
			await exited;
			clearTimeout(forced);
		},
		/** Every object key under `prefix`, as the fake holds them. */
		keys: (prefix: string) => storedKeys(prefix, endpoint),
		async remove(): Promise<void> {
			await this.stop();
			await rm(dir, { recursive: true, force: true });
		}
	};
}

/**
 * A storage endpoint that accepts connections and never answers (a hung service or a dropped
 * route): what the S3 client's request timeout is for.
 */
export async function silentStorage() {
	const port = await freePort();
	const sockets = new Set<Socket>();
	let seen = 0;
	const server = createServer((socket) => {
		seen++;
		sockets.add(socket);
		socket.on('error', () => undefined);
		socket.on('close', () => sockets.delete(socket));
		socket.resume(); // read and drop whatever is sent
	});
	await new Promise<void>((resolve) => server.listen(port, '127.0.0.1', resolve));
	return {
		endpoint: `http://127.0.0.1:${port}`,
		/** Connections the app opened to it, so a test can see the app really reached it. */
		connectionsSeen: () => seen,
		close: () =>
			new Promise<void>((resolve) => {
				for (const socket of sockets) socket.destroy();
				server.close(() => resolve());
			})
	};
}
