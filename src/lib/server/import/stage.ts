import { createHash, randomUUID } from 'node:crypto';
import { createWriteStream } from 'node:fs';
import { mkdir, open, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { Readable, Transform } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import { ImportError } from './errors';
import { IMPORT_LIMITS } from './limits';

export interface StagedFile {
	path: string;
	sha256: string;
	bytes: number;
}

/** Where uploads wait between upload, preview and import (IMPORT_STAGING_DIR, else the OS temp). */
export function stagingDir(): string {
	return process.env.IMPORT_STAGING_DIR || join(tmpdir(), 'fractile-imports');
}

/** Where a batch's file waits from its upload to the end of its import. */
export const stagedPathOf = (batchId: number) => join(stagingDir(), `batch-${batchId}.upload`);

const megabytes = (bytes: number) => `${Math.round(bytes / 1024 / 1024)} MB`;

/**
 * Streams an upload to a staging file, hashing it on the way, and stops at `maxBytes` with a
 * clear message (the partial file is removed). The file is never held in memory.
 */
export async function stageUpload(
	body: ReadableStream<Uint8Array> | Readable,
	maxBytes: number = IMPORT_LIMITS.maxFileBytes
): Promise<StagedFile> {
	await mkdir(stagingDir(), { recursive: true });
	const path = join(stagingDir(), `${randomUUID()}.upload`);
	const hash = createHash('sha256');
	let bytes = 0;
	const meter = new Transform({
		transform(chunk: Buffer, _enc, done) {
			bytes += chunk.length;
			if (bytes > maxBytes) {
				return done(
					new ImportError(
						'too-large',
						`The file is larger than the ${megabytes(maxBytes)} limit for one import; split it into smaller files.`,
						413
					)
				);
			}
			hash.update(chunk);
			done(null, chunk);
		}
	});
	const source = body instanceof Readable ? body : Readable.fromWeb(body as never);
	try {
		await pipeline(source, meter, createWriteStream(path));
	} catch (err) {
		await rm(path, { force: true });
		throw err;
	}
	return { path, sha256: hash.digest('hex'), bytes };
}

/** The first bytes of a staged file, for detection. */
export async function readSample(path: string, size: number = IMPORT_LIMITS.sampleBytes) {
	const handle = await open(path, 'r');
	try {
		const buffer = Buffer.alloc(size);
		const { bytesRead } = await handle.read(buffer, 0, size, 0);
		return buffer.subarray(0, bytesRead);
	} finally {
		await handle.close();
	}
}

export async function removeStaged(path: string): Promise<void> {
	await rm(path, { force: true });
}
