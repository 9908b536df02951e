import { describe, expect, it } from 'vitest';
import { isAbandoned, type RunningImport } from '$lib/server/import/abandoned';
import { IMPORT_LIMITS } from '$lib/server/import/limits';

const NOW = Date.parse('2026-03-02T10:00:00Z');
const run = (over: Partial<RunningImport> = {}): RunningImport => ({
	batchId: 1,
	organisationId: 1,
	connectionId: 42,
	heartbeatAt: new Date(NOW - 500),
	rowsRead: 10_000,
	...over
});

describe('isAbandoned', () => {
	it('leaves an import alone whose connection is open and which reported lately', () => {
		expect(isAbandoned(run(), new Set([42]), NOW)).toBe(false);
	});

	it('fails at once an import whose connection MariaDB no longer has, however fresh its report', () => {
		expect(isAbandoned(run(), new Set([7]), NOW)).toBe(true);
	});

	it('waits for the heartbeat limit when the connection was never recorded', () => {
		const early = run({ connectionId: null });
		expect(isAbandoned(early, new Set(), NOW)).toBe(false);
		expect(isAbandoned(early, new Set(), NOW + IMPORT_LIMITS.staleAfterMs + 1)).toBe(true);
	});

	it('fails a silent import even if its connection id is in use again (MariaDB restarted)', () => {
		const silent = run({ heartbeatAt: new Date(NOW - IMPORT_LIMITS.staleAfterMs - 1) });
		expect(isAbandoned(silent, new Set([42]), NOW)).toBe(true);
	});

	it('judges by the heartbeat alone where the process list cannot tell (several writable nodes)', () => {
		expect(isAbandoned(run(), null, NOW)).toBe(false);
		expect(isAbandoned(run(), null, NOW + IMPORT_LIMITS.staleAfterMs + 1)).toBe(true);
	});
});
