import { describe, expect, it } from 'vitest';
import {
	apparentDiffusionMm2PerYear,
	carbonationDepthMm,
	carbonationRateFromDepth,
	carbonationTimeToDepassivationYears,
	type ChlorideModel,
	chlorideContentAt,
	chlorideTimeToDepassivationYears,
	carbonationRates,
	depassivationAssessment,
	measuredDepassivation,
	FIB_TARGET_BETA_DEPASSIVATION,
	m2PerSToMm2PerYear,
	reliabilityIndex,
	timesToDepassivationYears,
	toSortedCovers
} from '../../../src/lib/analysis/index';

describe('carbonation x = k√t (worked example, arithmetic shown)', () => {
	it('k = 4 mm/√a, t = 25 a: x = 4 × 5 = 20 mm', () => {
		expect(carbonationDepthMm(4, 25)).toBeCloseTo(20, 12);
	});
	it('10 mm measured at 16 a: k = 10/√16 = 2.5 mm/√a; 30 mm cover reached at (30/2.5)² = 144 a', () => {
		const k = carbonationRateFromDepth(10, 16);
		expect(k).toBeCloseTo(2.5, 12);
		expect(carbonationTimeToDepassivationYears(30, k)).toBeCloseTo(144, 10);
		expect(carbonationTimeToDepassivationYears(30, 0)).toBeNull();
	});
});

// Cs = 3.0, C0 = 0.1 (% by binder), D = 32 mm²/a, t = 50 a → D·t = 1600 mm², 2√(Dt) = 80 mm.
// At x = 40 mm: x/(2√(Dt)) = 0.5, erf(0.5) = 0.5204998778 (A&S Table 7.1),
// C = 0.1 + 2.9 × (1 − 0.5204998778) = 0.1 + 2.9 × 0.4795001222 = 1.4905503544.
const CHLORIDE: ChlorideModel = {
	surfaceContent: 3,
	initialContent: 0.1,
	dRefMm2PerYear: 32,
	criticalContent: 0.6
};

describe('chloride, erf solution of Fick’s second law (worked example, arithmetic shown)', () => {
	it('C(40 mm, 50 a) = 1.49055 with erf(0.5) from A&S', () => {
		expect(chlorideContentAt(CHLORIDE, 40, 50)).toBeCloseTo(1.4905503544, 8);
	});
	it('ageing D(t) = D_ref(t_ref/t)^α: D_ref 32, t_ref 1 a, α 0.5 → D(64) = 32/8 = 4; Dt = 256, 2√ = 32 mm', () => {
		const aged = { ...CHLORIDE, tRefYears: 1, ageingExponent: 0.5 };
		expect(apparentDiffusionMm2PerYear(aged, 64)).toBeCloseTo(4, 12);
		// x = 16 mm → argument 0.5 → same C as above
		expect(chlorideContentAt(aged, 16, 64)).toBeCloseTo(1.4905503544, 8);
	});
	it('time to depassivation solves C(cover, t) = C_crit (round trip)', () => {
		const aged = { ...CHLORIDE, tRefYears: 1, ageingExponent: 0.4 };
		const t = chlorideTimeToDepassivationYears(aged, 50);
		expect(t).not.toBeNull();
		expect(chlorideContentAt(aged, 50, t ?? 0)).toBeCloseTo(0.6, 9);
		expect(chlorideTimeToDepassivationYears({ ...CHLORIDE, criticalContent: 4 }, 50)).toBeNull();
	});
	it('1e-12 m²/s = 31.5576 mm²/a (Julian year of 365.25 d)', () => {
		expect(m2PerSToMm2PerYear(1e-12)).toBeCloseTo(31.5576, 10);
	});
});

describe('depassivation share and reliability index', () => {
	it('fib Bulletin 34 (2006) target for depassivation β = 1.3 (from memory); Φ(−1.3) = 0.0968 (A&S 26.1)', () => {
		expect(FIB_TARGET_BETA_DEPASSIVATION).toBe(1.3);
		expect(reliabilityIndex(1 - 0.9031995154)).toBeCloseTo(1.3, 8);
		expect(reliabilityIndex(0)).toBeNull();
	});
	it('closed form: cover N(40, 8), depth 4√25 = 20 mm with CoV 0.25 → P = Φ(−20/√89) = Φ(−2.12) = 0.0170', () => {
		// √(5² + 8²) = √89 = 9.434; 20/9.434 = 2.120; Φ(2.12) = 0.98300 (A&S Table 26.1)
		const covers = toSortedCovers([30, 35, 40, 45, 50]);
		const cover = { model: 'normal' as const, location: 40, scale: 8 };
		const d = depassivationAssessment(
			covers,
			cover,
			{ kind: 'carbonation', kMmPerSqrtYear: 4, depthCov: 0.25 },
			{ years: [25] }
		);
		expect(d.atAges[0].method).toBe('closed-form-normal');
		expect(d.atAges[0].modelProbability).toBeCloseTo(1 - 0.983, 4);
		expect(d.atAges[0].reliabilityIndex).toBeCloseTo(2.12, 3);
		expect(d.atAges[0].empiricalShare).toBe(0);
		expect(d.atAges[0].meetsTarget).toBe(true);
	});
	it('seeded Monte Carlo agrees with the closed form for a near-normal lognormal cover, and repeats', () => {
		// Closed form with a normal cover N(40, 2): depth 7·√25 = 35 mm, σx = 3.5 mm,
		// P = Φ((35 − 40)/√(3.5² + 2²)) = Φ(−5/4.031) = Φ(−1.240) = 0.1075 (A&S 26.1: Φ(1.24) = 0.89251).
		// A lognormal cover of mean 40 mm and CoV 0.05 is nearly that normal: σ_ln² = ln(1.0025).
		const s2 = Math.log(1.0025);
		const cover = {
			model: 'lognormal' as const,
			location: Math.log(40) - s2 / 2,
			scale: Math.sqrt(s2)
		};
		const model = { kind: 'carbonation' as const, kMmPerSqrtYear: 7, depthCov: 0.1 };
		const covers = toSortedCovers([30, 40, 50]);
		const run = () =>
			depassivationAssessment(covers, cover, model, { years: [25], samples: 200_000, seed: 7 });
		const a = run().atAges[0];
		expect(a.method).toBe('monte-carlo');
		expect(Math.abs(a.modelProbability - (1 - 0.89251))).toBeLessThan(0.006); // MC s.e. ≈ 0.0007
		expect(run().atAges[0].modelProbability).toBe(a.modelProbability);
	});
	it('the share depassivated rises with age; times per reading match the closed form', () => {
		const covers = toSortedCovers([50, 55, 60, 65, 70]);
		const cover = { model: 'normal' as const, location: 60, scale: 8 };
		const slow = { ...CHLORIDE, dRefMm2PerYear: 10 };
		const d = depassivationAssessment(
			covers,
			cover,
			{ kind: 'chloride', chloride: slow, dCov: 0.2 },
			{ years: [10, 50, 100], samples: 20_000 }
		);
		const shares = d.atAges.map((x) => x.modelProbability);
		expect(shares[0]).toBeLessThan(shares[1]);
		expect(shares[1]).toBeLessThan(shares[2]);
		expect(d.atAges.map((x) => x.empiricalShare)).toEqual([0, 0, 0.6]);
		// erfc(z*) = (0.6 − 0.1)/2.9 = 0.1724 → z* ≈ 0.966; fronts 2·0.966·√(10·t): 19.3, 43.2, 61.1 mm
		// at 10, 50, 100 a → readings 50, 55, 60 ≤ 61.1 mm at 100 a: 3/5
		const times = timesToDepassivationYears([20, 30], { kind: 'carbonation', kMmPerSqrtYear: 2.5 });
		expect(times).toEqual([64, 144]);
	});
});

describe('one depassivation convention: cover < front, as for c_min (common practice: a reading equal to c_min complies)', () => {
	// k = 4 mm/√a at 25 a: front 4·5 = 20 mm exactly; covers 19, 20, 21 mm → only 19 is reached.
	const covers = toSortedCovers([19, 20, 21]);
	it('the assumed-model assessment counts a cover equal to the front as protected', () => {
		const point = { model: 'normal' as const, location: 20, scale: 0 };
		const d = depassivationAssessment(
			covers,
			point,
			{ kind: 'carbonation', kMmPerSqrtYear: 4 },
			{ years: [25] }
		);
		expect(d.atAges[0].criticalDepthMm).toBe(20);
		expect(d.atAges[0].empiricalShare).toBeCloseTo(1 / 3, 12);
		// A cover model with no spread sitting exactly on the front: not depassivated.
		expect(d.atAges[0].method).toBe('closed-form-fixed-front');
		expect(d.atAges[0].modelProbability).toBe(0);
	});
	it('the measured-front share agrees with it on the same front', () => {
		const rates = carbonationRates([{ depthsMm: [20], ageYears: 25 }]).rates;
		const now = measuredDepassivation(covers, { kind: 'carbonation', rates }, 25);
		expect(now.convention).toBe('cover < front');
		expect(now.share).toBeCloseTo(1 / 3, 12);
	});
});
