import { describe, expect, it } from 'vitest';
import { lockedMessage, lockSeconds, MAX_DELAY_SECONDS } from '$lib/server/auth/throttleRules';
describe('lockSeconds', () => {
	it('lets the first 5 account failures pass, then doubles from 30 s up to 15 minutes', () => {
		expect([1, 2, 3, 4].map((n) => lockSeconds('account', n))).toEqual([0, 0, 0, 0]);
		expect(lockSeconds('account', 5)).toBe(30);
		expect(lockSeconds('account', 6)).toBe(60);
		expect(lockSeconds('account', 7)).toBe(120);
		expect(lockSeconds('account', 40)).toBe(MAX_DELAY_SECONDS);
	});

	it('allows an address more failures than an account', () => {
		expect(lockSeconds('address', 19)).toBe(0);
		expect(lockSeconds('address', 20)).toBe(30);
	});
});

describe('lockedMessage', () => {
	it('says when to try again, in seconds or minutes', () => {
		const now = new Date('2026-01-01T10:00:00Z');
		expect(lockedMessage(new Date('2026-01-01T10:00:30Z'), now)).toBe(
			'Too many failed sign-ins. Try again in 30 seconds (after 10:00:30 UTC).'
		);
		expect(lockedMessage(new Date('2026-01-01T10:04:00Z'), now)).toContain('in 4 minutes');
	});
});
