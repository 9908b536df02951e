import { describe, expect, it } from 'vitest';
import { SeededRandom } from '../../../seeds/random';

describe('the demo scenario generator', () => {
	it('repeats itself exactly for the same seed and differs for another', () => {
		const a = new SeededRandom(42);
		const b = new SeededRandom(42);
		const c = new SeededRandom(43);
		const first = Array.from({ length: 50 }, () => a.normal(50, 8));
		expect(Array.from({ length: 50 }, () => b.normal(50, 8))).toEqual(first);
		expect(Array.from({ length: 50 }, () => c.normal(50, 8))).not.toEqual(first);
	});

	// Definition of the normal and lognormal distributions: sample moments of 200,000 draws fall
	// within a few standard errors of the parameters asked for.
	it('draws normals and lognormals with the mean and SD asked for', () => {
		const rng = new SeededRandom(7);
		for (const draw of [() => rng.normal(45, 6), () => rng.lognormal(45, 6)]) {
			const values = Array.from({ length: 200_000 }, draw);
			const mean = values.reduce((s, v) => s + v, 0) / values.length;
			const sd = Math.sqrt(values.reduce((s, v) => s + (v - mean) ** 2, 0) / (values.length - 1));
			expect(mean).toBeCloseTo(45, 1);
			expect(Math.abs(sd - 6)).toBeLessThan(0.06);
		}
	});

	it('keeps uniforms in [0, 1)', () => {
		const rng = new SeededRandom(1);
		for (let i = 0; i < 10_000; i++) {
			const u = rng.next();
			expect(u >= 0 && u < 1).toBe(true);
		}
	});
});
