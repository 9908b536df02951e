import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { countedFromSorted } from '$lib/analysis/countedSample';
import {
	decodeCounts,
	encodeCounts,
	encodeSortedCovers,
	gridCountsBuffer,
	readGridCounts
} from '$lib/server/readings/coverCountCodec';
import { GRIDS, drawOnGrid } from '../../helpers/quantized';

const TENTH = { den: 10, factor: 1 };
const sorted = (values: Float64Array) => Float64Array.from(values).sort();

describe('cover count codec', () => {
	it('writes grid counts as ZigZag and LEB128 varints (Protocol Buffers encoding guide)', () => {
		// https://protobuf.dev/programming-guides/encoding/ ("Varints", "Signed Integers"): 150 is
		// 0x96 0x01, 300 is 0xac 0x02; ZigZag maps 0, −1, 1, −2 to 0, 1, 2, 3. A member with one
		// cover at step k holds ZigZag(k), then its count.
		const one = { den: 1, factor: 1 };
		const single = (k: number, n = 1) =>
			encodeCounts(countedFromSorted(new Float64Array(n).fill(k), one)).bytes.toString('hex');
		expect(single(75)).toBe('9601' + '01');
		expect([0, -1, 1, -2].map((k) => single(k))).toEqual(['0001', '0101', '0201', '0301']);
		expect(single(0, 300)).toBe('00' + 'ac02');
		const steps = [-1, 0, 2];
		const covers = Float64Array.from([-1, 0, 0, 2]);
		const stored = encodeCounts(countedFromSorted(covers, one));
		// ZigZag(−1) = 1, count 1; gap 0, count 2; gap 1, count 1.
		expect(stored.bytes.toString('hex')).toBe('0101' + '0002' + '0101');
		const back = decodeCounts(stored.bytes, one);
		expect(Array.from(back.lattice!.steps)).toEqual(steps);
		expect(Array.from(back.values)).toEqual([-1, 0, 2]);
		expect(back.n).toBe(4);
	});

	it('gives back every value and count exactly, on each grid the import stores (property)', () => {
		fc.assert(
			fc.property(
				fc.integer({ min: 0, max: GRIDS.length - 1 }),
				fc.integer({ min: 1, max: 3000 }),
				fc.integer({ min: 1, max: 2 ** 30 }),
				fc.boolean(),
				(g, n, seed, signed) => {
					const grid = GRIDS[g];
					const covers = sorted(drawOnGrid(grid, signed ? 0 : 40, 30, n, seed, signed));
					const sample = countedFromSorted(covers, grid);
					const stored = encodeCounts(sample);
					expect(stored.grid).toEqual(grid);
					expect(stored.distinct).toBe(sample.values.length);
					const back = decodeCounts(stored.bytes, grid);
					expect(back.values).toEqual(sample.values);
					expect(back.counts).toEqual(sample.counts);
					expect(back.n).toBe(n);
				}
			),
			{ numRuns: 200 }
		);
	});

	it('keeps counts past one byte and steps far apart', () => {
		const covers = new Float64Array(70_000).fill(28.1);
		covers[0] = 0.1;
		const stored = encodeSortedCovers(sorted(covers));
		const back = decodeCounts(stored.bytes, TENTH);
		expect(Array.from(back.values)).toEqual([0.1, 28.1]);
		expect(Array.from(back.counts)).toEqual([1, 69_999]);
	});

	it('takes about 2 bytes an entry for a member of 1,000 readings at 0.1 mm, not 8', () => {
		const covers = sorted(drawOnGrid(TENTH, 45, 20, 1000, 7));
		const stored = encodeSortedCovers(covers);
		expect(stored.bytes.length).toBeLessThanOrEqual(2.1 * stored.distinct);
	});

	it('reads rows one after another into one buffer, growing it when a row needs more', () => {
		const into = gridCountsBuffer(2);
		const a = encodeSortedCovers(sorted(drawOnGrid(TENTH, 40, 10, 500, 3)));
		const b = encodeSortedCovers(Float64Array.from([30, 30.1]));
		const size = readGridCounts(a.bytes, into);
		expect(size).toBe(a.distinct);
		expect(into.steps.length).toBeGreaterThanOrEqual(size);
		expect(readGridCounts(b.bytes, into)).toBe(2);
		expect(Array.from(into.steps.subarray(0, 2))).toEqual([300, 301]);
		expect(Array.from(into.counts.subarray(0, 2))).toEqual([1, 1]);
	});

	it('keeps covers off every grid as float64 and uint32, 12 bytes an entry', () => {
		const covers = Float64Array.from([0.1 + 0.2, 0.1 + 0.2, 25.4 * 1.37]);
		const stored = encodeCounts(countedFromSorted(covers, null));
		expect(stored.grid).toBeNull();
		expect(stored.bytes.length).toBe(24);
		const back = decodeCounts(stored.bytes, null);
		expect(Array.from(back.values)).toEqual([0.1 + 0.2, 25.4 * 1.37]);
		expect(Array.from(back.counts)).toEqual([2, 1]);
	});

	it('refuses bytes that end inside an entry, over-long numbers and broken off-grid rows', () => {
		expect(() => decodeCounts(Buffer.from([0x02]), TENTH)).toThrow('end inside entry 1');
		expect(() => decodeCounts(Buffer.from([0x02, 0x81]), TENTH)).toThrow('end inside entry 1');
		expect(() =>
			decodeCounts(Buffer.from([0x02, 0xff, 0xff, 0xff, 0xff, 0xff, 0x01]), TENTH)
		).toThrow('over-long');
		expect(() => decodeCounts(Buffer.from([0x02, 0xff, 0xff, 0xff, 0xff, 0x7f]), TENTH)).toThrow(
			'past 32 bits'
		);
		expect(() => decodeCounts(Buffer.alloc(13), null)).toThrow('not whole 12-byte entries');
	});
});
