import { describe, expect, it } from 'vitest';
import {
	assessPopulation,
	ENGINE_VERSION,
	histogramSorted,
	enRequirement,
	toSortedCovers
} from '../../../src/lib/analysis/index';
import { viaductCoversMm } from './viaduct';

describe('assessPopulation result (design rule: plain JSON snapshot)', () => {
	const covers = viaductCoversMm();
	const req = enRequirement({ exposureClass: 'XC3', barDiameterMm: 12 });

	it('survives JSON unchanged and carries the options and ENGINE_VERSION', () => {
		const a = assessPopulation(covers, req, { charts: true, percentileType: 6, fractileP: 0.1 });
		expect(JSON.parse(JSON.stringify(a))).toEqual(a);
		expect(a.engineVersion).toBe(ENGINE_VERSION);
		expect(a.options).toMatchObject({
			fractileP: 0.1,
			confidence: 0.95,
			percentileType: 6,
			minSampleSize: 20
		});
		expect(a.charts?.ecdf.length).toBeLessThanOrEqual(500);
		expect(JSON.stringify(a)).not.toMatch(/NaN|Infinity/);
	});
	it('leaves chart data out unless asked', () => {
		expect(assessPopulation(covers, req).charts).toBeNull();
	});
	it('accepts a Float64Array and gives the same figures as an array', () => {
		const a = assessPopulation(Float64Array.from(covers), req);
		expect(a.description).toEqual(assessPopulation(covers, req).description);
	});
	it('needs 2 readings (house message)', () => {
		expect(() => assessPopulation([40], req)).toThrow('assessPopulation needs at least 2 readings');
	});
	it('histogram: fixed width counts every reading; Freedman–Diaconis bins stay within 5…100', () => {
		const s = toSortedCovers(covers);
		const fixed = histogramSorted(s, 5);
		expect(fixed.reduce((t, b) => t + b.count, 0)).toBe(200);
		expect(fixed[0].fromMm).toBe(25);
		const fd = histogramSorted(s);
		// FD (Freedman & Diaconis 1981): IQR 70 − 56 = 14 (type 7), h = 2·14·200^(−1/3) = 4.79 mm,
		// range 80 − 28 = 52 mm → ⌈10.86⌉ = 11 bins
		expect(fd.length).toBe(11);
	});
});
