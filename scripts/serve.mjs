// Serves the built app (./build) as several processes sharing one port: `node scripts/serve.mjs`.
// WEB_CONCURRENCY workers (default: one per CPU core) accept connections in turn (node:cluster);
// the app keeps no per-user state in process memory (sessions, throttling, import progress live
// in MariaDB), so any worker can answer any request. A worker that dies is replaced; SIGTERM or
// SIGINT stops the workers gracefully (adapter-node finishes their requests) and then this one.
import cluster from 'node:cluster';
import { availableParallelism } from 'node:os';
import { fileURLToPath } from 'node:url';

const requested = Number(process.env.WEB_CONCURRENCY || availableParallelism());
const workers = Number.isInteger(requested) && requested > 0 ? requested : 1;

if (cluster.isPrimary) {
	let stopping = false;
	cluster.setupPrimary({ exec: fileURLToPath(new URL('../build/index.js', import.meta.url)) });
	for (let i = 0; i < workers; i++) cluster.fork();
	cluster.on('exit', (worker, code, signal) => {
		if (stopping) {
			if (Object.keys(cluster.workers ?? {}).length === 0) process.exit(0);
			return;
		}
		console.error(`worker ${worker.process.pid} ended (${signal ?? code}); starting another`);
		cluster.fork();
	});
	const stop = () => {
		stopping = true;
		for (const worker of Object.values(cluster.workers ?? {})) worker?.kill('SIGTERM');
		if (Object.keys(cluster.workers ?? {}).length === 0) process.exit(0);
	};
	process.on('SIGTERM', stop);
	process.on('SIGINT', stop);
	console.log(`serving with ${workers} worker process(es)`);
}
