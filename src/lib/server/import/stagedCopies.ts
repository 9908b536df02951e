import { createReadStream } from 'node:fs';
import { open } from 'node:fs/promises';
import { Transform, type Readable } from 'node:stream';
import { deleteObject, getObjectIfStored, putObject } from '../storage/s3';
import { ImportError } from './errors';
import { removeStaged, stagedPathOf } from './stage';

/*
 * An upload waits for its import in two places: the staging folder of the machine that took it
 * (hashing, the size limit and the preview need a file, and that machine usually starts the
 * import too), and object storage, which every app machine behind the load balancer can read
 * when the start lands on another one (docs/scaling.md, "Staged uploads").
 */

/** The key of a batch's upload in object storage. */
export const stagedKeyOf = (batchId: number) => `imports/batch-${batchId}.upload`;

// 16 kB reads: parsed batches stay small and die young (64 kB batches waited long enough to be
// promoted, and the peak memory of a million-row import was ~30 MB higher).
const READ_CHUNK_BYTES = 16 * 1024;

/** Stores a staged upload for every app machine; StorageUnavailableError when storage is down. */
export async function storeStaged(batchId: number, path: string, bytes: number): Promise<void> {
	await putObject(stagedKeyOf(batchId), createReadStream(path), 'application/octet-stream', bytes);
}

/** This machine's copy, or null when it has none (the upload came in through another one). */
async function openLocal(batchId: number, bytes: number): Promise<Readable | null> {
	// Opened at once rather than checked and opened later: the staging folder's housekeeping may
	// remove the file between the two, and an open file stays readable after it is unlinked.
	const handle = await open(stagedPathOf(batchId), 'r').catch((err: NodeJS.ErrnoException) => {
		if (err.code === 'ENOENT') return null;
		throw err;
	});
	if (!handle) return null;
	// Another size is not this batch's file (a folder shared with another installation, whose
	// batch ids overlap ours): the stored copy is.
	if ((await handle.stat()).size !== bytes) {
		await handle.close();
		return null;
	}
	return handle.createReadStream({ highWaterMark: READ_CHUNK_BYTES });
}

const unreadable = () =>
	new ImportError(
		'upload-unreadable',
		'The uploaded file could not be read back from file storage, so nothing was written. Upload the file again.',
		503
	);

/**
 * The stored copy as the import reads it. A download that breaks off or comes up short fails
 * the import with a message of its own: the import's generic wording for a lost connection
 * would blame the database.
 */
function checkedDownload(body: Readable, bytes: number): Readable {
	let received = 0;
	const check = new Transform({
		transform(chunk: Buffer, _encoding, done) {
			received += chunk.length;
			done(null, chunk);
		},
		flush(done) {
			done(received === bytes ? null : unreadable());
		}
	});
	body.once('error', () => check.destroy(unreadable()));
	// An import that stops early (a cancel, a refused file) releases the storage connection.
	check.once('close', () => body.destroy());
	return body.pipe(check);
}

/**
 * A batch's upload from its start: this machine's copy if it has one, else the stored copy.
 * Throws StorageUnavailableError when it must come from storage and storage is down (the batch
 * stays pending, so the start can be tried again), ImportError when neither copy exists.
 */
export async function openStaged(batchId: number, bytes: number): Promise<Readable> {
	const local = await openLocal(batchId, bytes);
	if (local) return local;
	const stored = await getObjectIfStored(stagedKeyOf(batchId));
	if (stored) return checkedDownload(stored.body, bytes);
	throw new ImportError(
		'upload-missing',
		'The uploaded file is no longer kept, so this import cannot start. Upload the file again.',
		410
	);
}

/**
 * Removes this machine's copy and the stored one. Never throws: it runs when an import has
 * ended or been cancelled, which must stand even if storage is down; an object left behind is
 * logged, and the bucket's lifecycle rule for `imports/` removes it (docs/scaling.md).
 */
export async function removeStagedCopies(batchId: number): Promise<void> {
	await removeStaged(stagedPathOf(batchId)).catch((err: Error) =>
		console.error(`staged upload of import ${batchId} not removed:`, err.message)
	);
	await deleteObject(stagedKeyOf(batchId)).catch((err: Error) =>
		console.error(`object ${stagedKeyOf(batchId)} was left in storage:`, err.message)
	);
}
