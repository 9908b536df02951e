import { describe, expect, it } from 'vitest';
import { erfc, toSortedCovers, type PopulationAssessment } from '$lib/analysis/index';
import { shareWords, betaWords } from '$lib/components/risk/format';
import { HEADLINE_AGES_YEARS, curveAges, populationRisk } from '$lib/server/risk/compute';
import {
	measuredRisk,
	type ChlorideProfileData,
	type MeasuredRiskInput
} from '$lib/server/risk/measured';
import { measuredProvenance, sensitivityWords } from '$lib/server/risk/measuredProvenance';

const carbonationSettings = {
	critical: { value: 0, sd: 0, source: '' },
	statedInitialContent: 0,
	seed: 11
};
const chlorideSettings = {
	critical: { value: 0.6, sd: 0.15, source: 'stated for the test' },
	statedInitialContent: 0.1,
	seed: 11
};

/** Covers 10, 11, …, 59 mm: 50 readings, one a millimetre. */
const covers = toSortedCovers(Array.from({ length: 50 }, (_, i) => 10 + i));

function carbonationInput(overrides: Partial<MeasuredRiskInput> = {}): MeasuredRiskInput {
	// k = x/√t: 20 mm at 25 years → 4 mm/√year; 30 mm at 25 years → 6 mm/√year (worked by hand).
	return {
		sortedCoversMm: covers,
		measurements: {
			carbonation: [
				{
					memberLabel: 'B-1',
					label: 'CT-1',
					testedOn: '2025-01-01',
					ageYears: 25,
					depthsMm: [19, 20, 21],
					minMm: 19,
					maxMm: 21
				},
				{
					memberLabel: 'B-2',
					label: 'CT-2',
					testedOn: '2025-01-01',
					ageYears: 25,
					depthsMm: [29, 30, 31],
					minMm: 29,
					maxMm: 31
				}
			],
			chloride: []
		},
		kind: 'carbonation',
		designLifeYears: 100,
		ageAtSurveyYears: 25,
		headlineAges: HEADLINE_AGES_YEARS,
		curveAges: curveAges(100),
		...carbonationSettings,
		...overrides
	};
}

/** A noiseless profile from C_s, C_0 = 0.1, D_a (mm²/year) at 25 years, 5 mm increments. */
function profile(label: string, cs: number, da: number): ChlorideProfileData {
	const increments = Array.from({ length: 8 }, (_, i) => {
		const mid = 5 * i + 2.5;
		return {
			fromMm: 5 * i,
			toMm: 5 * i + 5,
			content: 0.1 + (cs - 0.1) * erfc(mid / (2 * Math.sqrt(da * 25))),
			outermost: i === 0
		};
	});
	return {
		memberLabel: 'D-1',
		label,
		testedOn: '2025-01-01',
		ageYears: 25,
		initialContent: 0.1,
		conversion: null,
		increments
	};
}

describe('risk from measured carbonation fronts (cover < front)', () => {
	const m = measuredRisk(carbonationInput())!;
	it('now: the mean over locations of #(cover < k√t)/n, worked by hand', () => {
		// At 25 years the fronts are 20 and 30 mm: covers 10–19 (10) and 10–29 (20) are below.
		expect(m.now!.share).toBeCloseTo((10 / 50 + 20 / 50) / 2, 12);
		expect(m.convention).toBe('cover < front');
		expect(m.locations.map((l) => l.kMmPerSqrtYear)).toEqual([4, 6]);
	});
	it('at the design life (100 years): fronts 40 and 60 mm → (30/50 + 50/50)/2', () => {
		expect(m.atDesignLife.share).toBeCloseTo(0.8, 12);
		expect(m.locations.map((l) => l.frontAtDesignLifeMm)).toEqual([40, 60]);
	});
	it('carries a band about every point of the curve, and the same seed gives the same band', () => {
		for (const c of m.curve) {
			expect(c.low).toBeLessThanOrEqual(c.share + 1e-12);
			expect(c.high).toBeGreaterThanOrEqual(c.share - 1e-12);
		}
		expect(m.curve.some((c) => c.high > c.low)).toBe(true);
		expect(measuredRisk(carbonationInput())).toEqual(m);
	});
	it('names its most telling input in one line', () => {
		expect(m.sensitivity).not.toBeNull();
		expect(sensitivityWords(m)).toMatch(
			/^Most telling input: .* moves the share at the design life from 80 %/
		);
		expect(sensitivityWords(null)).toMatch(/every input is assumed/);
	});
	it('is absent without tests, and without readings enough', () => {
		const none = carbonationInput({ measurements: { carbonation: [], chloride: [] } });
		expect(measuredRisk(none)).toBeNull();
		expect(measuredRisk(carbonationInput({ sortedCoversMm: toSortedCovers([30]) }))).toBeNull();
	});
});

describe('risk from fitted chloride profiles', () => {
	const input: MeasuredRiskInput = {
		...carbonationInput(),
		kind: 'chloride',
		designLifeYears: 50,
		curveAges: curveAges(50),
		measurements: { carbonation: [], chloride: [profile('CP-1', 3, 30)] },
		...chlorideSettings
	};
	it('the front at the design life is 2·erfc⁻¹((C_crit − C_0)/(C_s − C_0))·√(D_a·t) (scipy 1.17.1 erfcinv: 74.73613 mm)', () => {
		const m = measuredRisk(input)!;
		expect(m.locations[0].fit!.status).toBe('fitted');
		expect(m.locations[0].frontAtDesignLifeMm!).toBeCloseTo(74.7361266834875, 4);
		// Every cover (10–59 mm) is below a 74.7 mm front.
		expect(m.atDesignLife.share).toBe(1);
		// The excluded outermost increment is kept for the chart, marked not used.
		expect(m.locations[0].fit!.points[0].used).toBe(false);
		expect(m.locations[0].fit!.points.slice(1).every((p) => p.used)).toBe(true);
	});
	it('a profile that cannot be fitted is left out with a warning; the others carry the answer', () => {
		const flat = profile('CP-flat', 3, 30);
		flat.increments = flat.increments.map((i) => ({ ...i, content: 0.5 }));
		const m = measuredRisk({
			...input,
			measurements: { carbonation: [], chloride: [profile('CP-1', 3, 30), flat] }
		})!;
		expect(m.locations.map((l) => l.fit!.status)).toEqual(['fitted', 'refused']);
		expect(m.warnings.join(' ')).toMatch(/1 of 2 profiles could not be fitted/);
		expect(
			measuredRisk({ ...input, measurements: { carbonation: [], chloride: [flat] } })
		).toBeNull();
	});
	it('marks inputs measured, fitted (with standard error) and assumed (C_crit with its source)', () => {
		const measured = measuredRisk({
			...input,
			measurements: { carbonation: [], chloride: [profile('CP-1', 3, 30), profile('CP-2', 4, 20)] }
		})!;
		const rows = measuredProvenance(
			{ label: 'deck · XD3', exposureClass: 'XD3', n: 50, memberCount: 2 } as never,
			measured
		);
		const basis = Object.fromEntries(rows.map((r) => [r.input, r.basis]));
		expect(basis['Cover to the bars']).toBe('measured');
		expect(basis['Surface chloride content C_s']).toBe('fitted');
		expect(basis['Apparent diffusion coefficient D_a']).toBe('fitted');
		expect(basis['Critical chloride content C_crit']).toBe('assumed');
		const cs = rows.find((r) => r.input.startsWith('Surface'))!;
		// Mean of 3 and 4 with the standard error of the mean, |4 − 3|/2 = 0.5.
		expect(cs.value).toBe('3.50 % of binder ± 0.50 (SE)');
		expect(rows.find((r) => r.input === 'Chloride profiles')!.source).toContain(
			'CP-1 (D-1), CP-2 (D-1)'
		);
	});
});

describe('a population with measured fronts is judged on them', () => {
	const assessment = {
		description: { n: 50 },
		fractionBelowCMin: { empirical: 0.02 },
		requirement: { cMinMm: 11 },
		verdict: 'pass',
		chosenModel: 'normal',
		models: { normal: { model: 'normal', location: 34.5, scale: 14.6 }, lognormal: null }
	} as unknown as PopulationAssessment;
	const common = {
		populationId: 'p',
		label: 'beam · XC3',
		memberType: 'beam',
		exposureClass: 'XC3',
		memberCount: 2,
		areaM2: null,
		assessment,
		sortedCoversMm: covers,
		parameters: { kind: 'carbonation' as const, kMmPerSqrtYear: 1, depthCov: 0.3 },
		designLifeYears: 100,
		ageAtSurveyYears: 25
	};
	it('the measured share replaces the assumed projection, with its band', () => {
		const assumed = populationRisk(common);
		const measured = populationRisk({
			...common,
			measurements: carbonationInput().measurements,
			measuredSettings: carbonationSettings
		});
		expect(assumed.measured).toBeNull();
		expect(assumed.level).toBe('low-concern');
		expect(measured.measured).not.toBeNull();
		expect(measured.atDesignLife!.method).toBe('measured-front');
		expect(measured.atDesignLife!.modelProbability).toBeCloseTo(0.8, 12);
		expect(measured.atDesignLife!.band!.high).toBeGreaterThanOrEqual(0.8);
		// 30 % without protection at the survey, above Φ(−1.3) = 9.7 %: act now.
		expect(measured.level).toBe('act-now');
	});
});

describe('shares printed with what they are known to within', () => {
	const base = {
		reliabilityIndex: null,
		band: null,
		samples: null,
		standardError: null,
		lessThan: null
	};
	it('a simulation with no hit is "< 1/N" with its standard error, and β is not claimed', () => {
		const s = {
			...base,
			modelProbability: 0,
			method: 'monte-carlo',
			samples: 50_000,
			lessThan: 1 / 50_000,
			standardError: Math.sqrt(((1 / 50_000) * (1 - 1 / 50_000)) / 50_000)
		};
		// SE = √(P(1 − P)/N) at P = 1/N = 2e-5: √(2e-5 · 0.99998/50 000) = 2.0e-5, i.e. 0.002 %.
		expect(shareWords(s)).toBe('< 1/50,000 (0.002 %; SE 0.002 %)');
		expect(betaWords(s)).toBe('not claimed');
	});
	it('a simulated share carries its standard error; a measured one its band', () => {
		expect(
			shareWords({
				...base,
				modelProbability: 0.148,
				method: 'monte-carlo',
				standardError: 0.0016,
				samples: 50_000
			})
		).toBe('14.8 % ± 0.2 % (SE)');
		expect(
			shareWords({
				...base,
				modelProbability: 0.5,
				method: 'measured-front',
				band: { low: 0.1, high: 0.9 }
			})
		).toBe('50.0 % (band 10.0 %–90.0 %)');
	});
});
