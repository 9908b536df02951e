import { describe, expect, it } from 'vitest';
import { CoverCollector } from '$lib/server/readings/coverCollector';

describe('cover collector', () => {
	it('collects covers per member past its first allocation, and sorts them numerically', () => {
		const collector = new CoverCollector();
		for (let i = 0; i < 1000; i++) collector.add(1 + (i % 2), 1000 - i);
		collector.add(3, 9);
		collector.add(3, 10);
		const sorted = collector.sortedByMember();
		expect(sorted.get(1)!.length).toBe(500);
		expect(sorted.get(1)![0]).toBe(2);
		expect(sorted.get(2)![499]).toBe(999);
		// Numeric, not text order (text order would put 10 before 9).
		expect(Array.from(sorted.get(3)!)).toEqual([9, 10]);
	});
});
