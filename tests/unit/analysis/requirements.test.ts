import { describe, expect, it } from 'vitest';
import {
	aciCoverToleranceMm,
	aciRequirement,
	aciSpecifiedCoverIn,
	assessPopulation,
	cMinDurMm,
	enRequirement,
	inchToMm,
	mmToInch,
	formatCover,
	projectRequirement,
	structuralClassEn
} from '../../../src/lib/analysis/index';

describe('EN 1992-1-1:2004 Table 4.4N c_min,dur (recommended values, cells from memory)', () => {
	it.each([
		['S1', 'X0', 10],
		['S4', 'XC1', 15],
		['S4', 'XC3', 25],
		['S4', 'XC4', 30],
		['S4', 'XD1', 35],
		['S4', 'XS3', 45],
		['S3', 'XC2', 20],
		['S6', 'XD3', 55],
		['S5', 'XS2', 45],
		['S2', 'XC4', 20]
	] as const)('%s, %s: %i mm', (s, x, mm) => {
		expect(cMinDurMm(s, x)).toBe(mm);
	});
});

describe('EN 1992-1-1 Table 4.3N structural class adjustments', () => {
	it('S4 by default, S6 for 100 years (+2)', () => {
		expect(structuralClassEn({ exposureClass: 'XC3' })).toBe('S4');
		expect(structuralClassEn({ exposureClass: 'XC3', designLife100Years: true })).toBe('S6');
	});
	it('−1 for ≥ C35/45 in XC3, −1 slab geometry, −1 special QC, never below S1', () => {
		expect(structuralClassEn({ exposureClass: 'XC3', fckMpa: 35 })).toBe('S3');
		expect(structuralClassEn({ exposureClass: 'XC3', fckMpa: 30 })).toBe('S4');
		expect(
			structuralClassEn({
				exposureClass: 'XC1',
				fckMpa: 50,
				slabGeometry: true,
				specialQualityControl: true
			})
		).toBe('S1');
	});
	it('c_min = max(c_min,b; c_min,dur; 10 mm), c_nom = c_min + Δc_dev (Eqs. 4.1, 4.2; 4.4.1.3: 10 mm)', () => {
		const r = enRequirement({ exposureClass: 'XC3', barDiameterMm: 16 });
		expect([r.cMinMm, r.cNomMm, r.deltaCDevMm]).toEqual([25, 35, 10]);
		const bar = enRequirement({ exposureClass: 'XC1', barDiameterMm: 32, deltaCDevMm: 5 });
		expect([bar.cMinMm, bar.cNomMm]).toEqual([32, 37]);
		const floor = enRequirement({ exposureClass: 'X0', structuralClass: 'S1', barDiameterMm: 8 });
		expect(floor.cMinMm).toBe(10);
		expect(
			enRequirement({ exposureClass: 'XC1', barDiameterMm: 32, aggregateOver32Mm: true }).cMinMm
		).toBe(37);
		expect(() =>
			enRequirement({ exposureClass: 'XC3', barDiameterMm: 12, deltaCDevMm: 12 })
		).toThrow();
	});
});

describe('ACI 318-19 Table 20.5.1.3.1 and ACI 117', () => {
	it.each([
		['cast-against-ground', 'slab-joist-wall', 4, 3],
		['weather-or-ground', 'slab-joist-wall', 6, 2],
		['weather-or-ground', 'beam-column-pedestal-tie', 5, 1.5],
		['not-exposed', 'slab-joist-wall', 11, 0.75],
		['not-exposed', 'slab-joist-wall', 14, 1.5],
		['not-exposed', 'beam-column-pedestal-tie', 4, 1.5]
	] as const)('%s, %s, No. %i: %f in (ACI 318-19 Table 20.5.1.3.1)', (e, m, bar, inches) => {
		expect(aciSpecifiedCoverIn(e, m, bar)).toBe(inches);
	});
	it('ACI 117: −3/8 in up to 12 in deep, −1/2 in deeper, at most a third of the cover', () => {
		expect(aciCoverToleranceMm(inchToMm(1.5), inchToMm(12))).toBeCloseTo(inchToMm(3 / 8), 12);
		expect(aciCoverToleranceMm(inchToMm(2), inchToMm(18))).toBeCloseTo(inchToMm(0.5), 12);
		// 3/4 in cover: a third is 1/4 in, less than 3/8 in
		expect(aciCoverToleranceMm(inchToMm(0.75), inchToMm(6))).toBeCloseTo(inchToMm(0.25), 12);
	});
	it('builds a requirement in mm from the inch tables (25.4 mm/in exactly)', () => {
		const r = aciRequirement({
			exposure: 'weather-or-ground',
			member: 'slab-joist-wall',
			barSize: 5,
			memberDepthMm: 200
		});
		expect(r.cNomMm).toBeCloseTo(38.1, 12);
		expect(r.cMinMm).toBeCloseTo(38.1 - 9.525, 12);
		expect(r.codeSystem).toBe('ACI');
	});
	it('units: 1 in = 25.4 mm exactly (1959 international inch)', () => {
		expect(inchToMm(1)).toBe(25.4);
		expect(mmToInch(50.8)).toBe(2);
		expect(formatCover(38.1, 'in')).toBe('1.50 in');
		expect(formatCover(null)).toBe('–');
	});
});

describe('rules (common practice: statistical rules need 20 readings by default)', () => {
	const req = projectRequirement(45, 10, { deltaPlusMm: 15 }); // c_min 35, upper limit 60
	// 60 readings 44…52 mm: with none below c_min the exact 95 % bound is 1 − 0.05^(1/60) = 4.9 %,
	// just inside 5 % (59 is the smallest n that can show ≤ 5 % with no failures).
	const good = Array.from({ length: 60 }, (_, i) => 44 + (i % 9));
	it('a good population passes every rule of full-review, each with a reason', () => {
		const a = assessPopulation(good, req, {
			ruleSet: 'full-review',
			characteristicMethod: 'tolerance'
		});
		expect(a.rules.map((r) => r.outcome)).toEqual(['pass', 'pass', 'pass', 'pass', 'pass']);
		for (const r of a.rules) expect(r.reason).toMatch(/\.$/);
		expect(a.verdict).toBe('pass');
	});
	it('one low reading fails strict-minimum but not en-statistical with 200 readings', () => {
		const many = [...Array.from({ length: 199 }, (_, i) => 44 + (i % 9)), 30];
		expect(assessPopulation(many, req, { ruleSet: 'strict-minimum' }).verdict).toBe('fail');
		const stat = assessPopulation(many, req, {
			ruleSet: 'en-statistical',
			characteristicMethod: 'empirical'
		});
		expect(stat.rules.find((r) => r.id === 'fraction-below-min')?.outcome).toBe('pass');
	});
	it('too few readings: not enough data, with the count in the reason', () => {
		const a = assessPopulation(good.slice(0, 10), req);
		expect(a.verdict).toBe('not-enough-data');
		expect(a.rules[0].reason).toMatch(/Only 10 readings/);
		expect(assessPopulation(good.slice(0, 40), req).rules[1].outcome).toBe('fail'); // bound 7.2 % > 5 %
	});
	it('excess cover fails above c_nom + Δplus, and is skipped when no Δplus is given', () => {
		const deep = good.map((c) => c + 20);
		const a = assessPopulation(deep, req, { ruleSet: 'strict-minimum' });
		expect(a.rules.find((r) => r.id === 'excess-cover')?.outcome).toBe('fail');
		const noPlus = assessPopulation(deep, projectRequirement(45, 10), {
			ruleSet: 'strict-minimum'
		});
		expect(noPlus.skippedRules.map((s) => s.id)).toEqual(['excess-cover']);
	});
	it('ACI tolerance rule: a reading 10 mm under 38.1 mm specified fails (tolerance 9.525 mm)', () => {
		const r = aciRequirement({
			exposure: 'weather-or-ground',
			member: 'slab-joist-wall',
			barSize: 5,
			memberDepthMm: 200
		});
		const a = assessPopulation([40, 42, 39, 28.1], r);
		expect(a.options.ruleSet).toBe('aci-tolerance');
		expect(a.rules[0].outcome).toBe('fail');
		expect(assessPopulation([40, 42, 39, 28.6], r).rules[0].outcome).toBe('pass');
	});
});
