/**
 * Remembers the results of a pure function of numbers, by its exact arguments, up to `limit`
 * entries (then starts afresh). For the engine's costly numeric solvers (a noncentral t found
 * by quadrature, ≈ 10 CDFs a call), which the population pages ask again with the same
 * arguments on every view of the same data. Our own: a few lines, where a cache package would
 * bring expiry and size policies nothing here needs.
 * @example const f = remember((n: number) => slow(n)); f(3); f(3) // slow runs once
 */
export function remember<A extends number[]>(
	fn: (...args: A) => number,
	limit = 2000
): (...args: A) => number {
	const known = new Map<string, number>();
	return (...args: A) => {
		const key = args.join('|');
		const found = known.get(key);
		if (found !== undefined) return found;
		const value = fn(...args);
		if (known.size >= limit) known.clear();
		known.set(key, value);
		return value;
	};
}
