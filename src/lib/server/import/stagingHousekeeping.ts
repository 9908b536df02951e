import { building } from '$app/environment';
import { readdir, rm, stat } from 'node:fs/promises';
import { join } from 'node:path';
import { expireStalePreviews } from './expirePending';
import { stagingDir } from './stage';

/** Staged files untouched this long are left over; uploads take minutes at most. */
export const STAGED_FILE_STALE_MS = 60 * 60 * 1000;
const EVERY_MS = 60 * 60 * 1000;
let timer: NodeJS.Timeout | null = null;

/**
 * Removes the staged files in this machine's staging folder that have not changed for
 * STAGED_FILE_STALE_MS: the copies of uploads that another machine imported or cancelled (it
 * cannot reach this folder), and files a crash left half-written. Safe whenever it runs: every
 * pending batch's upload is also in object storage, which its import reads when this copy is
 * gone, and a running import holds its file open (an unlinked file stays readable).
 * Returns how many files it removed.
 */
export async function pruneStagingFolder(nowMs: number = Date.now()): Promise<number> {
	const dir = stagingDir();
	const names = await readdir(dir).catch((err: NodeJS.ErrnoException) => {
		if (err.code === 'ENOENT') return [];
		throw err;
	});
	let removed = 0;
	for (const name of names.filter((n) => n.endsWith('.upload'))) {
		const path = join(dir, name);
		const stats = await stat(path).catch(() => null);
		if (!stats?.isFile() || nowMs - stats.mtimeMs < STAGED_FILE_STALE_MS) continue;
		await rm(path, { force: true });
		removed++;
	}
	return removed;
}

async function prune(): Promise<void> {
	try {
		const removed = await pruneStagingFolder();
		if (removed > 0) console.info(`${removed} left-over staged upload(s) removed`);
		const expired = await expireStalePreviews();
		if (expired > 0) console.info(`${expired} stale import preview(s) expired`);
	} catch (err) {
		console.error('staging folder housekeeping:', err instanceof Error ? err.message : err);
	}
}

/** At start-up and hourly, each process on its own machine's folder. */
export function startStagingHousekeeping(): void {
	if (building || timer) return;
	void prune();
	timer = setInterval(() => void prune(), EVERY_MS);
	timer.unref();
}

export function stopStagingHousekeeping(): void {
	if (timer) clearInterval(timer);
	timer = null;
}
