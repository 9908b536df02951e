import { describe, expect, it } from 'vitest';
import { retryDelayMs } from '$lib/server/mail/outbox';

describe('retryDelayMs', () => {
	it('doubles after each failure, capped at an hour', () => {
		expect([1, 2, 3].map((n) => retryDelayMs(n, 30_000))).toEqual([30_000, 60_000, 120_000]);
		expect(retryDelayMs(30, 30_000)).toBe(3_600_000);
	});
});
