import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
	carbonationRates,
	chlorideContentAt,
	chlorideCriticalDepthMm,
	chlorideModelFromFit,
	depassivationSensitivity,
	erfc,
	fitChlorideProfile,
	type ChlorideFit,
	type MeasuredFront,
	measuredDepassivation,
	mulberry32,
	normalQuantile,
	normalSampler,
	projectMeasuredDepassivation,
	toSortedCovers
} from '../../../src/lib/analysis/index';

/** A profile of 8 increments of 5 mm made from Cs, Da (mm²/year) at an age, with relative noise. */
function madeProfile(
	cs: number,
	da: number,
	ageYears: number,
	noise: number,
	seed: number,
	label?: string
): ChlorideFit {
	const z = normalSampler(mulberry32(seed));
	const increments = Array.from({ length: 8 }, (_, i) => {
		const x = i * 5 + 2.5;
		const c = 0.05 + (cs - 0.05) * erfc(x / (2 * Math.sqrt(da * ageYears)));
		return { fromMm: i * 5, toMm: i * 5 + 5, content: c * (1 + noise * z()) };
	});
	return fitChlorideProfile({ label, ageYears, initialContent: 0.05, increments });
}

const ONE_TO_HUNDRED = toSortedCovers(Array.from({ length: 100 }, (_, i) => i + 1));

function carbonationFrontOf(...kAt25: number[]): MeasuredFront {
	// A depth of 5k mm read at 25 years gives k = 5k/√25 = k exactly.
	const tests = kAt25.map((k, i) => ({ label: `L${i + 1}`, depthsMm: [5 * k], ageYears: 25 }));
	return { kind: 'carbonation', rates: carbonationRates(tests).rates };
}

describe('share depassivated now (cover < front, the c_min convention: a cover equal to the front is protected)', () => {
	it('one location k = 4 at 25 a: front 4 × 5 = 20 mm; covers 10, 15 of 10…30 are below → 2/5', () => {
		const covers = toSortedCovers([10, 15, 20, 25, 30]);
		const now = measuredDepassivation(covers, carbonationFrontOf(4), 25);
		expect(now.share).toBeCloseTo(0.4, 12);
		expect(now.locations[0]).toEqual({ label: 'L1', frontDepthMm: 20, share: 0.4 });
		expect(now.convention).toBe('cover < front');
	});
	it('two locations, fronts 20 and 10 mm: (2/5 + 0/5)/2 = 0.2, the spread between locations kept', () => {
		const covers = toSortedCovers([10, 15, 20, 25, 30]);
		const now = measuredDepassivation(covers, carbonationFrontOf(4, 2), 25);
		expect(now.share).toBeCloseTo(0.2, 12);
		expect(now.locations.map((l) => l.share)).toEqual([0.4, 0]);
	});
	it('chloride: the front is the depth where the fitted profile reaches C_crit (round trip through chlorideContentAt)', () => {
		const fit = madeProfile(3, 30, 25, 0, 1);
		if (fit.status !== 'fitted') throw new Error(fit.reason);
		const now = measuredDepassivation(
			ONE_TO_HUNDRED,
			{ kind: 'chloride', fits: [fit], criticalContent: 0.6 },
			40
		);
		const depth = now.locations[0].frontDepthMm ?? NaN;
		const model = {
			surfaceContent: fit.surfaceContent,
			initialContent: 0.05,
			dRefMm2PerYear: fit.dMm2PerYear,
			criticalContent: 0.6
		};
		expect(chlorideContentAt(model, depth, 40)).toBeCloseTo(0.6, 9);
		expect(now.share).toBe(Math.ceil(depth - 1) / 100);
	});
	it('with an ageing exponent the front is the engine’s aged front, D(t) = Da·(t_s/t)^α (fib Bulletin 34 form)', () => {
		const fit = fitChlorideProfile(
			{
				ageYears: 25,
				initialContent: 0.05,
				increments: [0, 5, 10, 15, 20, 25].map((from) => ({
					fromMm: from,
					toMm: from + 5,
					content: 0.05 + 2.95 * erfc((from + 2.5) / (2 * Math.sqrt(30 * 25)))
				}))
			},
			{ ageingExponent: 0.4 }
		);
		if (fit.status !== 'fitted') throw new Error(fit.reason);
		const front: MeasuredFront = { kind: 'chloride', fits: [fit], criticalContent: 0.5 };
		// chlorideModelFromFit: D_ref = Da at t_ref = 25 a (the sampling age), α = 0.4
		const model = chlorideModelFromFit(fit, 0.5);
		expect(model).toMatchObject({ tRefYears: 25, ageingExponent: 0.4, criticalContent: 0.5 });
		const engine = chlorideCriticalDepthMm(model, 80);
		expect(measuredDepassivation(ONE_TO_HUNDRED, front, 80).locations[0].frontDepthMm).toBeCloseTo(
			engine ?? NaN,
			9
		);
	});
	it('profiles the fit refused are left out and counted', () => {
		const refused = fitChlorideProfile({
			ageYears: 20,
			initialContent: 0.05,
			increments: [{ fromMm: 0, toMm: 5, content: 1 }]
		});
		const now = measuredDepassivation(
			ONE_TO_HUNDRED,
			{ kind: 'chloride', fits: [madeProfile(3, 30, 25, 0.02, 2), refused], criticalContent: 0.6 },
			50
		);
		expect(now.refusedProfiles).toBe(1);
		expect(now.locations).toHaveLength(1);
	});
});

describe('edge cases: clear errors, never NaN', () => {
	const fit = madeProfile(3, 30, 25, 0.02, 3);
	it('C_crit ≤ Ci: every bar is depassivated (share 1, front null) at any age, even t = 0', () => {
		for (const critical of [0.05, 0.01]) {
			const front: MeasuredFront = { kind: 'chloride', fits: [fit], criticalContent: critical };
			expect(measuredDepassivation(ONE_TO_HUNDRED, front, 0)).toMatchObject({
				share: 1,
				locations: [{ frontDepthMm: null, share: 1 }]
			});
			const p = projectMeasuredDepassivation(ONE_TO_HUNDRED, front, { agesYears: [0, 50] });
			expect(p.atAges.flatMap((a) => [a.share, ...a.band.map((b) => b.share)])).toEqual(
				Array(8).fill(1)
			);
		}
	});
	it('C_crit ≥ Cs: the threshold is never reached, share 0; t = 0: the front is at the surface, share 0', () => {
		const never: MeasuredFront = { kind: 'chloride', fits: [fit], criticalContent: 10 };
		expect(measuredDepassivation(ONE_TO_HUNDRED, never, 100).share).toBe(0);
		const usual: MeasuredFront = { kind: 'chloride', fits: [fit], criticalContent: 0.6 };
		expect(measuredDepassivation(ONE_TO_HUNDRED, usual, 0).share).toBe(0);
	});
	it('zero scatter: one location read once gives a band that is a line on the central share', () => {
		const p = projectMeasuredDepassivation(ONE_TO_HUNDRED, carbonationFrontOf(4), {
			agesYears: [25, 100]
		});
		for (const a of p.atAges) for (const b of a.band) expect(b.share).toBe(a.share);
		expect(p.atAges.map((a) => a.share)).toEqual([0.19, 0.39]);
		expect(p.warnings[0]).toMatch(/One test location/);
	});
	it('every cover the same: shares are 0 or 1, no NaN', () => {
		const same = toSortedCovers([30, 30, 30]);
		const p = projectMeasuredDepassivation(same, carbonationFrontOf(4, 8), { agesYears: [25] });
		expect(p.atAges[0].share).toBe(0.5);
	});
	it('throws on negative or NaN ages, bad covers, no usable front, a bad C_crit or bootstrap setting', () => {
		const front = carbonationFrontOf(4);
		expect(() => measuredDepassivation(ONE_TO_HUNDRED, front, -1)).toThrow(/age 1/);
		expect(() =>
			projectMeasuredDepassivation(ONE_TO_HUNDRED, front, { agesYears: [10, NaN] })
		).toThrow(/age 2/);
		expect(() => measuredDepassivation(new Float64Array(0), front, 10)).toThrow(
			/at least 1 readings/
		);
		expect(() => measuredDepassivation(Float64Array.of(10, NaN), front, 10)).toThrow(/cover 2/);
		expect(() => measuredDepassivation(Float64Array.of(20, 10), front, 10)).toThrow(/sorted/);
		expect(() => measuredDepassivation(Float64Array.of(-5, 10), front, 10)).toThrow(/cover 1/);
		expect(() =>
			measuredDepassivation(ONE_TO_HUNDRED, { kind: 'carbonation', rates: [] }, 10)
		).toThrow(/at least 1 test/);
		const refused = fitChlorideProfile({ ageYears: 5, initialContent: 0, increments: [] });
		expect(() =>
			measuredDepassivation(
				ONE_TO_HUNDRED,
				{ kind: 'chloride', fits: [refused], criticalContent: 0.4 },
				10
			)
		).toThrow(/every profile was refused/);
		expect(() =>
			measuredDepassivation(
				ONE_TO_HUNDRED,
				{ kind: 'chloride', fits: [fit], criticalContent: NaN },
				10
			)
		).toThrow(/C_crit/);
		expect(() =>
			projectMeasuredDepassivation(ONE_TO_HUNDRED, front, { agesYears: [10], replicates: 1 })
		).toThrow(/replicates/);
		expect(() =>
			projectMeasuredDepassivation(ONE_TO_HUNDRED, front, {
				agesYears: [10],
				bandProbabilities: [1.5]
			})
		).toThrow(/band probabilities/);
	});
	it('any valid front and covers give shares in [0, 1] and an ordered band (property, fast-check)', () => {
		fc.assert(
			fc.property(
				fc.array(fc.double({ min: 0, max: 120, noNaN: true }), { minLength: 1, maxLength: 40 }),
				fc.array(fc.double({ min: 0, max: 12, noNaN: true }), { minLength: 1, maxLength: 6 }),
				fc.array(fc.double({ min: 0, max: 200, noNaN: true }), { minLength: 1, maxLength: 4 }),
				(covers, ks, ages) => {
					const p = projectMeasuredDepassivation(
						toSortedCovers(covers),
						carbonationFrontOf(...ks),
						{
							agesYears: ages,
							replicates: 50
						}
					);
					return p.atAges.every(
						(a) =>
							a.share >= 0 &&
							a.share <= 1 &&
							a.band.every(
								(b, i) =>
									b.share >= 0 && b.share <= 1 && (i === 0 || b.share >= a.band[i - 1].share)
							)
					);
				}
			),
			{ numRuns: 200 }
		);
	}, 30_000);
});

describe('projection over time with a bootstrap band', () => {
	it('two locations k = 2 and 6: replicates draw {2,2}, {2,6}, {6,6} with 1/4, 1/2, 1/4, so the 5/50/95 % band is 0.09, 0.19, 0.29 at 25 a', () => {
		// fronts 10 and 30 mm over covers 1…100: 9 and 29 covers strictly below
		const p = projectMeasuredDepassivation(ONE_TO_HUNDRED, carbonationFrontOf(2, 6), {
			agesYears: [25],
			replicates: 2000,
			seed: 5
		});
		expect(p.atAges[0].share).toBeCloseTo(0.19, 12);
		expect(p.atAges[0].band.map((b) => b.share)).toEqual([0.09, 0.19, 0.29]);
	});
	it('is seeded: the same seed repeats, another seed differs; the central share rises with age', () => {
		const fits = [1, 2, 3, 4].map((s) => madeProfile(2 + s * 0.5, 15 + 8 * s, 25, 0.04, s));
		const front: MeasuredFront = { kind: 'chloride', fits, criticalContent: 0.6 };
		const run = (seed: number) =>
			projectMeasuredDepassivation(ONE_TO_HUNDRED, front, { agesYears: [25, 50, 100], seed });
		expect(run(3)).toEqual(run(3));
		expect(run(4).atAges[1].band).not.toEqual(run(3).atAges[1].band);
		const shares = run(3).atAges.map((a) => a.share);
		expect(shares[0]).toBeLessThan(shares[1]);
		expect(shares[1]).toBeLessThan(shares[2]);
	});
	it('the band narrows as profiles are added: 3, 6 and 20 profiles with the same spread (Cs, ln Da at normal quantile spacing)', () => {
		// z_i = Φ⁻¹((i + ½)/m): the same population of profiles, sampled evenly, without draw luck
		const deck = (m: number) =>
			Array.from({ length: m }, (_, i) => {
				const zi = normalQuantile((i + 0.5) / m);
				return madeProfile(3.2 + 0.6 * zi, 30 * Math.exp(0.4 * zi), 25, 0.03, 100 + i);
			});
		const width = (m: number) => {
			const a = projectMeasuredDepassivation(
				ONE_TO_HUNDRED,
				{ kind: 'chloride', fits: deck(m), criticalContent: 0.6 },
				{ agesYears: [50] }
			).atAges[0].band;
			return a[2].share - a[0].share;
		};
		const [three, six, twenty] = [width(3), width(6), width(20)];
		expect(six).toBeLessThan(three);
		expect(twenty).toBeLessThan(six);
	});
	it('property (fast-check): more profiles with the same spread narrow the band (each set measured four times over)', () => {
		fc.assert(
			fc.property(
				fc.array(
					fc.record({
						cs: fc.double({ min: 1.5, max: 5, noNaN: true }),
						lnDa: fc.double({ min: Math.log(5), max: Math.log(80), noNaN: true })
					}),
					{ minLength: 2, maxLength: 5 }
				),
				fc.integer({ min: 1, max: 1000 }),
				(params, seed) => {
					const fits = params.map((p, i) =>
						madeProfile(p.cs, Math.exp(p.lnDa), 25, 0.03, seed + i)
					);
					const band = (list: ChlorideFit[]) => {
						const b = projectMeasuredDepassivation(
							ONE_TO_HUNDRED,
							{ kind: 'chloride', fits: list, criticalContent: 0.5 },
							{ agesYears: [60], replicates: 400, seed }
						).atAges[0].band;
						return b[2].share - b[0].share;
					};
					const few = band(fits);
					// A band a step or two wide is ruled by the count's discreteness, not by the spread.
					fc.pre(few >= 0.02);
					return band([...fits, ...fits, ...fits, ...fits]) < few;
				}
			),
			{ numRuns: 40 }
		);
	}, 30_000);
});

describe('sensitivity at the design life (one SD of each input, one at a time)', () => {
	it('worked by hand: covers 1…100, k = 3 and 5 at 25 a → share (14 + 24)/200 = 0.19; k ± 1 (s.e. of the mean k = √2/√2) → 0.14/0.24; cover mean ± 2.901 mm → 0.22/0.17', () => {
		const s = depassivationSensitivity(ONE_TO_HUNDRED, carbonationFrontOf(3, 5), {
			designLifeYears: 25
		});
		expect(s.share).toBeCloseTo(0.19, 12);
		expect(s.inputs.map((r) => r.input)).toEqual(['carbonation-rate', 'cover-mean', 'cover-sd']);
		const [k, mean, sd] = s.inputs;
		expect(k.sd).toBeCloseTo(1, 12);
		expect([k.shareMinus, k.sharePlus]).toEqual([0.14, 0.24]);
		expect(k.largestChange).toBeCloseTo(0.05, 12);
		// s of 1…100 = 29.01149, s/√100 = 2.901149: covers + 2.9 → thresholds 12.1, 22.1 → (12 + 22)/200
		expect(mean.sd).toBeCloseTo(2.901149, 6);
		expect([mean.shareMinus, mean.sharePlus]).toEqual([0.22, 0.17]);
		// s/√198 = 29.01149/14.07125 = 2.061757; spread ×1.071067 → thresholds 17.36, 26.69 → (17 + 26)/200 = 0.215
		expect(sd.sd).toBeCloseTo(2.061757, 6);
		expect(sd.sharePlus).toBeCloseTo(0.215, 12);
		expect(sd.shareMinus).toBeCloseTo(0.175, 12);
	});
	it('chloride: ranks Cs, Da and the stated C_crit and α; without their SDs they are listed as not ranked', () => {
		const fits = [1, 2, 3, 4, 5].map((s) => madeProfile(2.5 + 0.3 * s, 20 + 5 * s, 25, 0.03, s));
		const front: MeasuredFront = { kind: 'chloride', fits, criticalContent: 0.6 };
		const plain = depassivationSensitivity(ONE_TO_HUNDRED, front, { designLifeYears: 50 });
		expect(plain.notRanked.map((r) => r.input)).toEqual(['critical-content', 'ageing-exponent']);
		expect(plain.inputs.map((r) => r.input).sort()).toEqual(
			['cover-mean', 'cover-sd', 'diffusion-coefficient', 'surface-content'].sort()
		);
		const stated = depassivationSensitivity(ONE_TO_HUNDRED, front, {
			designLifeYears: 50,
			criticalContentSd: 0.3,
			ageingExponentSd: 0.1
		});
		expect(stated.inputs).toHaveLength(6);
		const changes = stated.inputs.map((r) => r.largestChange);
		expect(changes).toEqual([...changes].sort((a, b) => b - a));
		// a lower threshold depassivates more, a higher one less
		const crit = stated.inputs.find((r) => r.input === 'critical-content');
		expect(crit?.shareMinus).toBeGreaterThan(stated.share);
		expect(crit?.sharePlus).toBeLessThan(stated.share);
		for (const r of stated.inputs) expect(Number.isFinite(r.shareMinus + r.sharePlus)).toBe(true);
	});
	it('throws on a bad design life or SD', () => {
		const front = carbonationFrontOf(3);
		expect(() => depassivationSensitivity(ONE_TO_HUNDRED, front, { designLifeYears: NaN })).toThrow(
			/design life/
		);
		expect(() =>
			depassivationSensitivity(ONE_TO_HUNDRED, front, {
				designLifeYears: 50,
				criticalContentSd: -1
			})
		).toThrow(/C_crit SD/);
	});
});
