/**
 * A small seeded random generator, ours because neither jstat nor simple-statistics offers a
 * seeded one (Math.random cannot be replayed, and an assessment snapshot must be reproducible).
 * mulberry32 by Tommy Ettinger (public domain), a 32-bit generator with period 2^32.
 */

/** Uniform numbers in [0, 1) from a 32-bit seed. @example mulberry32(42)() // same value every run */
export function mulberry32(seed: number): () => number {
	let state = seed >>> 0;
	return () => {
		state = (state + 0x6d2b79f5) >>> 0;
		let t = state;
		t = Math.imul(t ^ (t >>> 15), t | 1);
		t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
		return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
	};
}

/** Standard normal variates by the Box–Muller transform on a uniform generator. */
export function normalSampler(uniform: () => number): () => number {
	let spare: number | null = null;
	return () => {
		if (spare !== null) {
			const s = spare;
			spare = null;
			return s;
		}
		const u = 1 - uniform();
		const r = Math.sqrt(-2 * Math.log(u));
		const angle = 2 * Math.PI * uniform();
		spare = r * Math.sin(angle);
		return r * Math.cos(angle);
	};
}
