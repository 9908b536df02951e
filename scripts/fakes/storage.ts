// A local stand-in for S3-compatible object storage (s3rver), for development and tests only.
// `tsx scripts/fakes/storage.ts`
import { mkdirSync } from 'node:fs';
import S3rver from 's3rver';

const port = Number(process.env.S3_FAKE_PORT ?? 4569);
const dir = process.env.S3_FAKE_DIR ?? '.local/s3';
const bucket = process.env.S3_BUCKET ?? 'fractile';
mkdirSync(dir, { recursive: true });

const server = new S3rver({
	address: '127.0.0.1',
	port,
	directory: dir,
	silent: true,
	configureBuckets: [{ name: bucket, configs: [] }]
});

await server.run();
console.log(`storage fake listening on 127.0.0.1:${port}, bucket ${bucket}, files in ${dir}`);
const stop = () => server.close().then(() => process.exit(0));
process.on('SIGTERM', stop);
process.on('SIGINT', stop);
