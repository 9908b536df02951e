import { describe, expect, it } from 'vitest';
import {
	assessPopulation,
	compareModels,
	detectResolutionMm,
	fitNormal,
	groupedChiSquare,
	mulberry32,
	normalSampler,
	projectRequirement,
	toSortedCovers
} from '../../../src/lib/analysis/index';

const roundTo = (x: number, step: number) => Math.round(x / step) * step;

describe('the meter’s resolution, read from the readings (common practice: 1, 0.5 or 0.1 mm)', () => {
	const z = normalSampler(mulberry32(3));
	const draw = (step: number) =>
		toSortedCovers(Array.from({ length: 200 }, () => roundTo(50 + 6 * z(), step)));
	it.each([1, 0.5, 0.1])('readings logged in %f mm steps give %f mm', (step) => {
		expect(detectResolutionMm(draw(step))).toBe(step);
	});
	it('continuous readings, or fewer than 8, give none', () => {
		expect(
			detectResolutionMm(toSortedCovers(Array.from({ length: 50 }, () => 50 + 6 * z())))
		).toBeNull();
		expect(detectResolutionMm(Float64Array.of(40, 41, 42))).toBeNull();
	});
});

describe('chi-square over resolution-aware classes', () => {
	// 100 readings of 47…53 mm with counts 5 10 20 30 20 10 5; the normal fitted by x̄, s;
	// classes (−∞, 48.5), [48.5, 49.5), [49.5, 50.5), [50.5, 51.5), [51.5, ∞) after merging to E ≥ 5:
	// scipy 1.17.1 stats.chisquare(O, E, ddof=2) gives X² = 0.5566363655980611, p = 0.75705590102238.
	const sorted = toSortedCovers(
		[47, 48, 49, 50, 51, 52, 53].flatMap((v, i) => Array([5, 10, 20, 30, 20, 10, 5][i]).fill(v))
	);
	it('X², classes and p as scipy', () => {
		const g = groupedChiSquare(sorted, fitNormal(sorted), 1);
		expect(g.classes).toBe(5);
		expect(g.degreesOfFreedom).toBe(2);
		expect(g.statistic).toBeCloseTo(0.5566363655980611, 9);
		expect(g.pValue!).toBeCloseTo(0.75705590102238, 7);
	});
	it('says in words when ties alone would have rejected a model', () => {
		const zz = normalSampler(mulberry32(8));
		const readings = toSortedCovers(Array.from({ length: 3000 }, () => Math.round(50 + 6 * zz())));
		const m = compareModels(readings);
		expect(m.resolutionMm).toBe(1);
		expect(m.normal.andersonDarling!.pValue).toBeLessThan(0.05);
		expect(m.normal.decidedBy).toBe('grouped-chi-square');
		expect(m.normal.rejected).toBe(false);
		expect(m.warnings.join(' ')).toMatch(
			/Anderson–Darling would reject the normal model \(p < 0\.001\) for the ties alone: the meter logs in steps of 1 mm/
		);
		expect(m.warnings.join(' ')).not.toMatch(/two populations/);
	});
	it('near-constant readings (40 and 41 mm only) give no mixture warning', () => {
		const readings = [...Array(190).fill(40), ...Array(10).fill(41)];
		const a = assessPopulation(readings, projectRequirement(45, 10));
		expect(a.models.normal.rejected).toBeNull();
		expect(a.warnings.join(' ')).not.toMatch(/two populations/);
		expect(a.warnings.join(' ')).toMatch(/too few to test the shape/);
	});
	it('two populations on a 1 mm grid are still found', () => {
		const zz = normalSampler(mulberry32(21));
		const readings = Array.from({ length: 600 }, (_, i) =>
			Math.round((i % 100 < 20 ? 30 : 55) + 3 * zz())
		);
		const m = compareModels(toSortedCovers(readings));
		expect(m.normal.rejected).toBe(true);
		expect(m.lognormal!.rejected).toBe(true);
		expect(m.warnings.join(' ')).toMatch(/two populations/);
	});
});

describe('seeded simulation: normal readings rounded to 1 mm are not rejected above the nominal rate', () => {
	// 1000 samples of 200 readings from N(50, 6²) rounded to 1 mm, tested at 5 %. The binomial
	// standard error of a 5 % rate over 1000 samples is √(0.05·0.95/1000) = 0.0069; we allow
	// three of them (common practice), so at most 7.1 %. Anderson–Darling on the same samples
	// rejects far more often (ties), which is what the grouped test is for.
	it('grouped chi-square rejects at most 7.1 %; Anderson–Darling at least twice as often', () => {
		const z = normalSampler(mulberry32(12345));
		let grouped = 0;
		let andersonDarling = 0;
		const samples = 1000;
		for (let r = 0; r < samples; r++) {
			const s = toSortedCovers(Array.from({ length: 200 }, () => Math.round(50 + 6 * z())));
			const m = compareModels(s);
			if (m.normal.rejected) grouped++;
			if (m.normal.andersonDarling!.pValue < 0.05) andersonDarling++;
		}
		expect(grouped / samples).toBeLessThanOrEqual(0.071);
		expect(grouped / samples).toBeGreaterThan(0.02);
		expect(andersonDarling).toBeGreaterThan(2 * grouped);
	});
});
