import { describe, expect, it } from 'vitest';
import {
	fitNormalMixture,
	lowComponentShare,
	mulberry32,
	normalSampler,
	toSortedCovers
} from '../../../src/lib/analysis/index';

// 10 000 generated readings: 30 % from N(35, 4²) (a low patch) and 70 % from N(55, 5²).
// Tolerances: a share's standard error is about √(0.3·0.7/10 000) = 0.005 and a mean's about
// 4/√3000 = 0.07 mm, so ±0.02 on shares and ±0.4 mm on means and SDs is several of them
// (common practice; the known generating values are the reference).
function generated(seed: number): Float64Array {
	const z = normalSampler(mulberry32(seed));
	const u = mulberry32(seed + 1);
	return toSortedCovers(
		Array.from({ length: 10_000 }, () => (u() < 0.3 ? 35 + 4 * z() : 55 + 5 * z()))
	);
}

describe('two-component normal mixture by EM (Dempster, Laird & Rubin 1977)', () => {
	const sorted = generated(42);
	const mixture = fitNormalMixture(sorted, { seed: 7 });
	it('recovers the known components from 10 000 readings', () => {
		const [low, high] = mixture.components;
		expect(Math.abs(low.share - 0.3)).toBeLessThan(0.02);
		expect(Math.abs(high.share - 0.7)).toBeLessThan(0.02);
		expect(Math.abs(low.meanMm - 35)).toBeLessThan(0.4);
		expect(Math.abs(high.meanMm - 55)).toBeLessThan(0.4);
		expect(Math.abs(low.sdMm - 4)).toBeLessThan(0.4);
		expect(Math.abs(high.sdMm - 5)).toBeLessThan(0.4);
		expect(mixture.converged).toBe(true);
		expect(mixture.twoComponentsPreferred).toBe(true);
	});
	it('the log-likelihood never decreases from one iteration to the next (EM’s ascent property)', () => {
		for (let i = 1; i < mixture.trace.length; i++) {
			expect(mixture.trace[i]).toBeGreaterThanOrEqual(
				mixture.trace[i - 1] - 1e-9 * Math.abs(mixture.trace[i - 1])
			);
		}
		expect(mixture.trace.length).toBeGreaterThan(2);
	});
	it('repeats exactly with the same seed', () => {
		expect(fitNormalMixture(sorted, { seed: 7 }).logLikelihood).toBe(mixture.logLikelihood);
	});
	it('one normal population: BIC does not prefer two components', () => {
		const z = normalSampler(mulberry32(5));
		const one = toSortedCovers(Array.from({ length: 5000 }, () => 50 + 6 * z()));
		expect(fitNormalMixture(one, { seed: 1 }).twoComponentsPreferred).toBe(false);
	});
	it('a member of the low patch carries the low component; a member of the rest does not', () => {
		const z = normalSampler(mulberry32(9));
		const lowMember = Float64Array.from({ length: 200 }, () => 35 + 4 * z());
		const highMember = Float64Array.from({ length: 200 }, () => 55 + 5 * z());
		expect(lowComponentShare(mixture, lowMember)).toBeGreaterThan(0.9);
		expect(lowComponentShare(mixture, highMember)).toBeLessThan(0.1);
	});
});
