import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { countBelowSorted, toSortedCovers } from '../../../src/lib/analysis/index';
import { coverCounter } from '../../../src/lib/analysis/durability/coverIndex';

describe('bucket index over sorted covers', () => {
	it('counts covers strictly below a depth: 40, 45, 50 → 1 below 45 (a cover equal to the depth is not counted, the c_min convention)', () => {
		const count = coverCounter(Float64Array.of(40, 45, 50));
		expect([count(0), count(40), count(45), count(45.0001), count(50), count(51)]).toEqual([
			0, 0, 1, 2, 2, 3
		]);
		expect(coverCounter(Float64Array.of(30, 30))(30)).toBe(0);
		expect(coverCounter(Float64Array.of(30, 30))(30.5)).toBe(2);
	});
	it('equals the plain binary search for any covers and depths, ties and bucket edges included (property)', () => {
		fc.assert(
			fc.property(
				fc.array(fc.integer({ min: 0, max: 400 }), { minLength: 1, maxLength: 300 }),
				fc.array(fc.double({ min: -5, max: 45, noNaN: true }), { minLength: 1, maxLength: 50 }),
				(tenths, depths) => {
					const sorted = toSortedCovers(tenths.map((t) => t / 10));
					const count = coverCounter(sorted);
					const probes = [...depths, ...sorted];
					return probes.every((d) => count(d) === countBelowSorted(sorted, d));
				}
			),
			{ numRuns: 300 }
		);
	});
});
