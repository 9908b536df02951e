import { mkdtemp, readdir, rm, utimes, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { pruneStagingFolder, STAGED_FILE_STALE_MS } from '$lib/server/import/stagingHousekeeping';

describe('pruneStagingFolder', () => {
	let dir: string;
	const saved = process.env.IMPORT_STAGING_DIR;
	beforeEach(async () => {
		dir = await mkdtemp(join(tmpdir(), 'fractile-prune-'));
		process.env.IMPORT_STAGING_DIR = dir;
	});
	afterEach(async () => {
		process.env.IMPORT_STAGING_DIR = saved;
		await rm(dir, { recursive: true, force: true });
	});

	async function file(name: string, ageMs: number, nowMs: number) {
		await writeFile(join(dir, name), 'readings');
		const at = new Date(nowMs - ageMs);
		await utimes(join(dir, name), at, at);
	}

	it('removes staged files untouched for the stale age, and nothing else', async () => {
		const nowMs = Date.now();
		await file('batch-1.upload', STAGED_FILE_STALE_MS + 1_000, nowMs);
		await file('0c6e-half-written.upload', 3 * STAGED_FILE_STALE_MS, nowMs);
		await file('batch-2.upload', STAGED_FILE_STALE_MS - 60_000, nowMs);
		await file('notes.txt', 3 * STAGED_FILE_STALE_MS, nowMs);
		expect(await pruneStagingFolder(nowMs)).toBe(2);
		expect((await readdir(dir)).sort()).toEqual(['batch-2.upload', 'notes.txt']);
	});

	it('finds nothing to do in a staging folder that does not exist yet', async () => {
		process.env.IMPORT_STAGING_DIR = join(dir, 'never-made');
		expect(await pruneStagingFolder()).toBe(0);
	});
});
