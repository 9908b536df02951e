import { describe, expect, it } from 'vitest';
import {
	CoverCollector,
	decodeCovers,
	encodeCovers,
	mergeSorted
} from '$lib/server/readings/coverSetCodec';

describe('cover set codec', () => {
	it('stores doubles exactly, 8 bytes each, little-endian (IEEE 754 binary64)', () => {
		const covers = Float64Array.from([0.1 + 0.2, 25.4 * 1.37, 1e-9, 300]);
		const bytes = encodeCovers(covers);
		expect(bytes.length).toBe(32);
		// 300 = 0x4072C00000000000 (IEEE 754): little-endian puts 0x40 last.
		expect(bytes.subarray(24).toString('hex')).toBe('0000000000c07240');
		expect(Array.from(decodeCovers(bytes))).toEqual(Array.from(covers));
		// From an unaligned view, as a connector may hand a BLOB over.
		const shifted = Buffer.concat([Buffer.from([7]), bytes]).subarray(1);
		expect(Array.from(decodeCovers(shifted))).toEqual(Array.from(covers));
	});

	it('refuses bytes that are not whole covers', () => {
		expect(() => decodeCovers(Buffer.alloc(12))).toThrow('not whole 8-byte covers');
	});

	it('merges two sorted arrays into one sorted array, keeping repeats', () => {
		const merged = mergeSorted(
			Float64Array.from([20, 30, 30, 45]),
			Float64Array.from([10, 30, 50])
		);
		expect(Array.from(merged)).toEqual([10, 20, 30, 30, 30, 45, 50]);
		expect(Array.from(mergeSorted(new Float64Array(0), Float64Array.from([1])))).toEqual([1]);
	});

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
