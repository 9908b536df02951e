/**
 * Counting covers below a depth many times over: a bucket index on the sorted covers.
 *
 * The bootstrap asks "how many covers lie strictly below this front?" about a million times
 * for one projection (replicates × locations × ages). A plain binary search over 100 000
 * covers takes 17 dependent steps, most of them cache misses; the index first maps the depth
 * to one of ≈ n equal-width buckets, whose first and last positions are stored, and searches
 * only inside it (one or two steps for smooth data). Same answer as countBelowSorted.
 */
import { countBelowSorted } from '../readings';

export type CountBelow = (depthMm: number) => number;

/**
 * A function counting the sorted covers strictly below a depth (the c_min convention: a cover
 * equal to the depth is not counted). Build cost O(n + buckets·log n); each count O(1) on
 * smooth data, O(log n) at worst. Memory 8·(buckets + 1) bytes, buckets ≤ 65 536.
 * @example coverCounter(Float64Array.of(40, 45, 50))(45) // 1
 */
export function coverCounter(sorted: Float64Array): CountBelow {
	const n = sorted.length;
	const min = sorted[0];
	const max = sorted[n - 1];
	const buckets = Math.min(65_536, Math.max(1, n));
	if (!(max > min)) return (depth) => (depth > min ? n : 0);
	const width = (max - min) / buckets;
	const starts = new Int32Array(buckets + 1);
	for (let b = 0; b <= buckets; b++) starts[b] = countBelowSorted(sorted, min + b * width);
	starts[buckets] = countBelowSorted(sorted, max);
	return (depth) => {
		if (depth <= min) return 0;
		if (depth > max) return n;
		const b = Math.min(buckets - 1, Math.floor((depth - min) / width));
		// countBelow(depth) lies between the counts at the bucket's edges; one bucket more on
		// each side absorbs the rounding of min + b·width.
		let lo = starts[Math.max(0, b - 1)];
		let hi = starts[Math.min(buckets, b + 2)];
		while (lo < hi) {
			const mid = (lo + hi) >>> 1;
			if (sorted[mid] < depth) lo = mid + 1;
			else hi = mid;
		}
		return lo;
	};
}
