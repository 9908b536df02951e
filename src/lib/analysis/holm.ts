/**
 * Holm's step-down correction for multiple comparisons: S. Holm, "A simple sequentially
 * rejective multiple test procedure", Scand. J. Statist. 6 (1979) 65–70. Our own: a few lines.
 */

/**
 * Holm-adjusted p-values, in the order given: sort ascending, p̃_(i) = max_{j ≤ i} min(1,
 * (m − j + 1)·p_(j)). Rejecting where p̃ < α holds the family-wise error at α. Cost O(m log m).
 * @example holmAdjust([0.01, 0.04, 0.03]) // [0.03, 0.06, 0.06]
 */
export function holmAdjust(pValues: readonly number[]): number[] {
	const m = pValues.length;
	const order = pValues.map((p, i) => [p, i] as const).sort((a, b) => a[0] - b[0]);
	const out = new Array<number>(m);
	let running = 0;
	order.forEach(([p, index], j) => {
		running = Math.max(running, Math.min(1, (m - j) * p));
		out[index] = running;
	});
	return out;
}
