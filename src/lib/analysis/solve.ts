/**
 * Root finding for monotone functions (our own: the packages have no solver).
 */

/**
 * Solve f(x) = target for a continuous monotone f, starting from a guess bracket [lo, hi] that is
 * widened until it brackets the root, then the Illinois variant of regula falsi.
 * Cost: typically 8–15 evaluations of f for a relative tolerance of 1e-12.
 * @example solveMonotone((x) => x * x, 2, 0, 1) // 1.41421356...
 */
export function solveMonotone(
	f: (x: number) => number,
	target: number,
	lo: number,
	hi: number,
	tolerance = 1e-12
): number {
	let a = lo;
	let b = hi;
	let fa = f(a) - target;
	let fb = f(b) - target;
	for (let i = 0; i < 60 && fa * fb > 0; i++) {
		const width = b - a;
		if (Math.abs(fa) < Math.abs(fb)) {
			a -= width;
			fa = f(a) - target;
		} else {
			b += width;
			fb = f(b) - target;
		}
	}
	if (fa * fb > 0) throw new Error('solveMonotone could not bracket the root');
	let side = 0;
	for (let i = 0; i < 200; i++) {
		const c = (a * fb - b * fa) / (fb - fa);
		const fc = f(c) - target;
		if (fc === 0 || Math.abs(b - a) <= tolerance * Math.max(1, Math.abs(c))) return c;
		if (fc * fb > 0) {
			b = c;
			fb = fc;
			if (side === -1) fa /= 2;
			side = -1;
		} else {
			a = c;
			fa = fc;
			if (side === 1) fb /= 2;
			side = 1;
		}
	}
	return (a + b) / 2;
}
