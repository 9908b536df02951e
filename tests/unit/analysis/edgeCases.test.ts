import { describe, expect, it } from 'vitest';
import {
	aciRequirement,
	andersonDarling,
	apparentDiffusionMm2PerYear,
	assessPopulation,
	carbonationTimeToDepassivationYears,
	characteristicCovers,
	type ChlorideModel,
	chlorideContentAt,
	chlorideTimeToDepassivationYears,
	clopperPearsonUpper,
	compareModels,
	depassivationAssessment,
	fitNormal,
	fractionBelowUpperBound,
	logNormalCdf,
	normalQuantile,
	normalUpperQuantile,
	percentileSorted,
	predictionFactor,
	projectRequirement,
	toleranceFactor,
	toSortedCovers,
	verifyMeter
} from '../../../src/lib/analysis/index';

describe('normal quantile down to p = 1e-300 (Wichura AS 241; values from scipy 1.17.1 stats.norm.ppf)', () => {
	it.each([
		[1e-300, -37.0470962993612],
		[1e-200, -30.20559417957964],
		[1e-100, -21.273453560965322],
		[1e-50, -14.933337534788487],
		[1e-20, -9.262340089798409],
		[1e-10, -6.361340902404056],
		[1e-5, -4.264890793922825],
		[0.001, -3.090232306167813],
		[0.02425, -1.972961051311885],
		[0.05, -1.6448536269514729],
		[0.3, -0.5244005127080409],
		[0.7, 0.5244005127080407],
		[0.975, 1.959963984540054],
		[0.999, 3.090232306167813]
	])('Φ⁻¹(%s) = %s within 1e-9 relative', (p, z) => {
		expect(Math.abs(normalQuantile(p) / z - 1)).toBeLessThan(1e-9);
	});
	it('the upper tail keeps its precision: z with 1 − Φ(z) = 1e-300 is 37.0470962993612 (scipy norm.isf)', () => {
		expect(Math.abs(normalUpperQuantile(1e-300) / 37.0470962993612 - 1)).toBeLessThan(1e-9);
	});
	it.each([
		[-40, -804.6084420137539],
		[-10, -53.23128515051248],
		[-1.5, -2.7059444008238898],
		[3, -0.0013508099647481925]
	])('ln Φ(%f) = %f (scipy 1.17.1 stats.norm.logcdf), finite where Φ underflows', (z, value) => {
		expect(Math.abs(logNormalCdf(z) / value - 1)).toBeLessThan(1e-12);
	});
});

describe('Anderson–Darling in log space', () => {
	// 1999 readings of 49–51 mm and one of 2000 mm: that reading is 44.7 SDs out, where the
	// normal CDF underflows. scipy 1.17.1 stats.anderson(x, 'norm').statistic = 748.1559551208375,
	// and on ln x 541.098057847782 (both with the SD at ddof = 1, as ours).
	const x = toSortedCovers([
		...Array.from({ length: 1999 }, (_, i) => 50 + 0.01 * (((i * 37) % 200) - 100)),
		2000
	]);
	it('A² stays finite and equals scipy’s for a reading far in the tail', () => {
		const ad = andersonDarling(x, fitNormal(x));
		expect(Math.abs(ad.statistic / 748.1559551208375 - 1)).toBeLessThan(1e-9);
		expect(ad.pValue).toBe(0);
	});
	it('the lognormal’s A² too, and the models are rejected rather than shown as null', () => {
		const models = compareModels(x);
		expect(
			Math.abs(models.lognormal!.andersonDarling!.statistic / 541.098057847782 - 1)
		).toBeLessThan(1e-9);
		expect(models.normal.rejected).toBe(true);
	});
});

describe('the excess-cover rule takes the chosen percentile type and confidence', () => {
	// x(19) = 60, x(20) = 70, n = 20; limit c_nom + Δplus = 55 + 10 = 65 mm.
	// 95th percentile: type 7 60.5 mm, type 6 69.5 mm (numpy 1.x percentile 'linear'/'weibull');
	// one reading above 65 mm: Clopper–Pearson upper bound B⁻¹(γ; 2, 19) = 0.18096 at γ = 0.9,
	// 0.21611 at γ = 0.95 (scipy 1.17.1 stats.beta.ppf).
	const readings = [50, 51, 51, 52, 53, 53, 54, 54, 55, 55, 56, 56, 57, 57, 58, 58, 59, 59, 60, 70];
	const requirement = projectRequirement(55, 10, { deltaPlusMm: 10 });
	const excess = (options: Parameters<typeof assessPopulation>[2]) =>
		assessPopulation(readings, requirement, { ruleSet: 'strict-minimum', ...options }).rules.find(
			(r) => r.id === 'excess-cover'
		)!;
	it('type 7 passes at 60.5 mm, type 6 fails at 69.5 mm', () => {
		expect(excess({ percentileType: 7 }).figures.upperFractileMm).toBeCloseTo(60.5, 9);
		expect(excess({ percentileType: 7 }).outcome).toBe('pass');
		expect(excess({ percentileType: 6 }).figures.upperFractileMm).toBeCloseTo(69.5, 9);
		expect(excess({ percentileType: 6 }).outcome).toBe('fail');
	});
	it('the bound on the share above is at the chosen confidence', () => {
		expect(excess({ confidence: 0.9 }).figures.upperBoundAbove).toBeCloseTo(0.1809609634367385, 8);
		expect(excess({ confidence: 0.95 }).figures.upperBoundAbove).toBeCloseTo(0.2161061642068473, 8);
	});
});

describe('c_min = c_nom − Δc_dev is a length, not a floating-point residue', () => {
	it('45.3 − 10.1 gives c_min 35.2 mm, and a reading of 35.2 mm is not below it (EN 1992-1-1 Eq. 4.1)', () => {
		const requirement = projectRequirement(45.3, 10.1);
		expect(requirement.cMinMm).toBe(35.2);
		const a = assessPopulation([35.2, 40, 42, 45, 50], requirement, { minSampleSize: 2 });
		expect(a.fractionBelowCMin.count).toBe(0);
	});
	it('ACI: 1.5 in − 3/8 in = 1.125 in = 28.575 mm exactly (ACI 117-10 §2.2.4)', () => {
		const r = aciRequirement({
			exposure: 'weather-or-ground',
			member: 'slab-joist-wall',
			barSize: 5,
			memberDepthMm: 200
		});
		expect(r.cMinMm).toBe(28.575);
	});
});

describe('readings all equal (σ = 0)', () => {
	const requirement = projectRequirement(45, 10);
	it('no NaN, no model test, no "two populations", no lognormal chosen over a constant', () => {
		// 60 readings: with none below, Clopper–Pearson's 95 % bound 1 − 0.05^(1/60) = 4.87 % ≤ 5 %.
		const a = assessPopulation(Array(60).fill(40.1), requirement, { charts: true });
		expect(a.description.sdMm).toBe(0);
		expect(a.description.cov).toBe(0);
		expect(a.models.normal.rejected).toBeNull();
		expect(a.models.normal.andersonDarling).toBeNull();
		expect(a.chosenModel).toBe('normal');
		expect(a.warnings.join(' ')).not.toMatch(/two populations/);
		expect(a.warnings.join(' ')).toMatch(/All 60 readings are 40.1 mm/);
		expect(a.characteristic.chosenMm).toBe(40.1);
		expect(a.fractionBelowCMin.normal).toBe(0);
		expect(a.verdict).toBe('pass');
		expect(JSON.stringify(a)).not.toMatch(/NaN/);
	});
	it('a constant equal to c_min is not below it; one under it is wholly below', () => {
		const at = assessPopulation(Array(25).fill(35), requirement);
		expect(at.fractionBelowCMin.normal).toBe(0);
		expect(at.fractionBelowCMin.lognormal).toBe(0);
		const under = assessPopulation(Array(25).fill(34), requirement);
		expect(under.fractionBelowCMin.normal).toBe(1);
		expect(under.verdict).toBe('fail');
	});
});

describe('inputs refused with a clear message', () => {
	it('an empty string or null is not read as 0 mm; a negative cover is refused', () => {
		expect(() => toSortedCovers(['' as unknown as number, 40])).toThrow(/reading 1 .*empty/);
		expect(() => toSortedCovers([40, null as unknown as number])).toThrow(/reading 2 .*null/);
		expect(() => toSortedCovers([40, -1])).toThrow(/reading 2 is negative/);
		expect(() =>
			assessPopulation([40, 41, null as unknown as number], projectRequirement(45, 10))
		).toThrow(/reading 3/);
	});
	it('an unknown percentile type is refused, not taken as type 6', () => {
		const s = toSortedCovers([1, 2, 3, 4]);
		expect(() => percentileSorted(s, 0.25, 5 as 6)).toThrow(/type must be 6 or 7/);
		expect(() =>
			assessPopulation([40, 41, 42], projectRequirement(45, 10), { percentileType: 5 as 6 })
		).toThrow(/type must be 6 or 7/);
	});
	it('a confidence outside (0, 1) is refused by every bound', () => {
		expect(() => clopperPearsonUpper(1, 10, 1.5)).toThrow(/confidence/);
		expect(() => clopperPearsonUpper(1, 10, 0)).toThrow(/confidence/);
		expect(() => toleranceFactor(10, 0.05, 1)).toThrow(/confidence/);
		expect(() => fractionBelowUpperBound(50, 5, 10, 40, -0.5)).toThrow(/confidence/);
		const s = toSortedCovers([40, 45, 50]);
		expect(() => characteristicCovers(s, fitNormal(s), null, 0.05, 1.2)).toThrow(/confidence/);
	});
	it('the prediction factor at n = ∞ is z(0.95) = 1.6448536269514722 (EN 1990 Table D1: 1.64; scipy 1.17.1 norm.ppf)', () => {
		expect(predictionFactor(Infinity, 0.05)).toBeCloseTo(1.6448536269514722, 12);
	});
	it('a fractional n is refused by the factors and bounds', () => {
		expect(() => predictionFactor(10.5)).toThrow(/whole number/);
		expect(() => toleranceFactor(10.5)).toThrow(/whole number/);
		expect(() => fractionBelowUpperBound(50, 5, 10.5, 40)).toThrow(/whole number/);
	});
});

describe('meter verification', () => {
	it('uncertainty t(0.975; 9)·s_e·√(1 + 1/11) = 2.92178 mm on Anscombe I (scipy 1.17.1 t.ppf = 2.262157)', () => {
		const v = verifyMeter(
			[10, 8, 13, 9, 11, 14, 6, 4, 12, 7, 5],
			[8.04, 6.95, 7.58, 8.81, 8.33, 9.96, 7.24, 4.26, 10.84, 4.82, 5.68]
		);
		expect(v.tQuantile).toBeCloseTo(2.262157162798205, 6);
		expect(v.uncertaintyMm).toBeCloseTo(2.921779675322639, 6);
	});
	it('every hole read the same: the bias alone, s from the differences (n − 1), no NaN', () => {
		// differences 1.5, 2.0, 0.5, 3.0, 2.5: mean 1.9, s = 0.96177 (numpy std ddof=1);
		// t(0.975; 4) = 2.776445 → U = 2.776445·0.96177·√1.2 = 2.92517 (scipy 1.17.1).
		const v = verifyMeter([40, 40, 40, 40, 40], [41.5, 42, 40.5, 43, 42.5]);
		expect(v.slopeFixed).toBe(true);
		expect(v.slope).toBe(1);
		expect(v.interceptMm).toBeCloseTo(1.9, 12);
		expect(v.residualSdMm).toBeCloseTo(0.9617692030835673, 10);
		expect(v.uncertaintyMm).toBeCloseTo(2.925166429216675, 6);
	});
});

// Cs = 3.0, C0 = 0.1, C_crit = 0.6 (% by binder), D = 32 mm²/a (the worked example of
// durability.test.ts).
const CHLORIDE: ChlorideModel = {
	surfaceContent: 3,
	initialContent: 0.1,
	dRefMm2PerYear: 32,
	criticalContent: 0.6
};

describe('durability edge cases', () => {
	const covers = toSortedCovers([30, 40, 50]);
	const cover = { model: 'normal' as const, location: 40, scale: 8 };
	it('C_crit ≤ C0: every reading is already depassivated (share 1, time 0)', () => {
		const already = { ...CHLORIDE, criticalContent: 0.05 };
		const d = depassivationAssessment(
			covers,
			cover,
			{ kind: 'chloride', chloride: already },
			{ years: [10] }
		);
		expect(d.atAges[0].empiricalShare).toBe(1);
		expect(d.atAges[0].modelProbability).toBe(1);
		expect(chlorideTimeToDepassivationYears(already, 40)).toBe(0);
	});
	it('negative depths, negative ages, negative D and NaN are errors, not numbers', () => {
		expect(() => chlorideContentAt(CHLORIDE, -5, 10)).toThrow(/depth/);
		expect(() => chlorideContentAt(CHLORIDE, 10, -1)).toThrow(/age/);
		expect(() => chlorideContentAt({ ...CHLORIDE, dRefMm2PerYear: -32 }, 10, 10)).toThrow(
			/diffusion/
		);
		expect(() => chlorideContentAt(CHLORIDE, NaN, 10)).toThrow(/depth/);
		expect(() => carbonationTimeToDepassivationYears(30, NaN)).toThrow(/k/);
		expect(() => carbonationTimeToDepassivationYears(-3, 2)).toThrow(/cover/);
		expect(() =>
			depassivationAssessment(
				covers,
				cover,
				{ kind: 'carbonation', kMmPerSqrtYear: 3 },
				{ years: [-5] }
			)
		).toThrow(/ages/);
	});
	it('t = 0 with ageing: D(0) is refused, the content is the initial one (D(t)·t → 0)', () => {
		const aged = { ...CHLORIDE, tRefYears: 1, ageingExponent: 0.5 };
		expect(() => apparentDiffusionMm2PerYear(aged, 0)).toThrow(/t = 0/);
		expect(chlorideContentAt(aged, 10, 0)).toBe(0.1);
	});
	it('σ_cover = 0 and no depth scatter: P = 1 where the front passes the cover, 0 where it only reaches it, not 0/0', () => {
		// k = 3 mm/√a: front 30 mm at 100 a (equal to every cover: protected, cover < front is
		// the convention), 33 mm at 121 a (past every cover: all depassivated).
		const point = { model: 'normal' as const, location: 30, scale: 0 };
		const d = depassivationAssessment(
			toSortedCovers([30, 30, 30]),
			point,
			{ kind: 'carbonation', kMmPerSqrtYear: 3, depthCov: 0 },
			{ years: [100, 121] }
		);
		expect(d.atAges[0].modelProbability).toBe(0);
		expect(d.atAges[0].empiricalShare).toBe(0);
		expect(d.atAges[1].modelProbability).toBe(1);
		expect(d.atAges[1].empiricalShare).toBe(1);
	});
	it('a fixed front has a closed form: chloride without scatter, P = Φ((x_crit − μ)/σ)', () => {
		// x_crit = 2·erfc⁻¹(0.5/2.9)·√(32·50) = 77.18714 mm; Φ((77.18714 − 50)/8) = 0.99966108
		// (scipy 1.17.1 special.erfcinv, stats.norm.cdf).
		const d = depassivationAssessment(
			covers,
			{ model: 'normal', location: 50, scale: 8 },
			{ kind: 'chloride', chloride: CHLORIDE },
			{ years: [50] }
		);
		expect(d.atAges[0].method).toBe('closed-form-fixed-front');
		expect(d.atAges[0].criticalDepthMm).toBeCloseTo(77.18713973471861, 8);
		expect(d.atAges[0].modelProbability).toBeCloseTo(0.9996610844788966, 9);
	});
	it('a simulated probability below 1/N is reported as "< 1/N" with its standard error, β not claimed', () => {
		const d = depassivationAssessment(
			covers,
			{ model: 'normal', location: 200, scale: 5 },
			{ kind: 'chloride', chloride: CHLORIDE, dCov: 0.2 },
			{ years: [10], samples: 1000 }
		);
		const a = d.atAges[0];
		expect(a.method).toBe('monte-carlo');
		expect(a.modelProbability).toBe(0);
		expect(a.lessThan).toBe(0.001);
		// √(0.001·0.999/1000) = 0.00099950 (common practice: the binomial standard error)
		expect(a.standardError).toBeCloseTo(0.0009994998749374609, 12);
		expect(a.reliabilityIndex).toBeNull();
	});
});
