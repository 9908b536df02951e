import { describe, expect, it } from 'vitest';
import {
	chloridePercentOfBinder,
	erfc,
	fitChlorideProfile,
	type ChlorideFit,
	type ChlorideFitted,
	type ChlorideProfile,
	mm2PerYearToM2PerS
} from '../../../src/lib/analysis/index';
import { leastSquares2 } from '../../../src/lib/analysis/durability/leastSquares2';

function relative(actual: number, expected: number): number {
	return Math.abs(actual / expected - 1);
}

function fitted(fit: ChlorideFit): ChlorideFitted {
	if (fit.status !== 'fitted') throw new Error(`expected a fit, got: ${fit.reason}`);
	return fit;
}

function profile(
	ageYears: number,
	initialContent: number,
	rows: readonly (readonly [number, number, number])[]
): ChlorideProfile {
	return {
		ageYears,
		initialContent,
		increments: rows.map(([fromMm, toMm, content]) => ({ fromMm, toMm, content }))
	};
}

// Invented profiles; the first increment of each is the outermost one, left out of the fit.
// Reference numbers printed by tests/unit/fixtures/chloride_profiles_scipy.py with scipy 1.17.1:
// scipy.optimize.curve_fit (method 'lm', MINPACK; ftol = xtol = gtol = 1e-15, which the default
// tolerances match to 1.3e-5), pcov with absolute_sigma=False, residual SD √(Σr²/(n − 2)).
const SCIPY_1_17_1 = [
	{
		name: 'deck-A',
		profile: profile(25, 0.05, [
			[0, 5, 2.6],
			[5, 10, 2.893],
			[10, 15, 2.675],
			[15, 20, 2.402],
			[20, 25, 2.135],
			[25, 30, 1.753],
			[30, 40, 1.32],
			[40, 50, 0.892]
		]),
		expected: [3.50432228, 32.0310838, 0.08267932053, 2.474759663, 0.07814668916]
	},
	{
		name: 'deck-B',
		profile: profile(12, 0.08, [
			[0, 4, 1.95],
			[4, 8, 1.874],
			[8, 12, 1.384],
			[12, 16, 0.979],
			[16, 20, 0.721],
			[20, 25, 0.542],
			[25, 30, 0.327]
		]),
		expected: [2.554809246, 10.86870818, 0.08088947149, 0.7353713814, 0.0480419953]
	},
	{
		name: 'ramp-C',
		profile: profile(38, 0.1, [
			[0, 5, 3.9],
			[5, 10, 4.351],
			[10, 20, 3.754],
			[20, 30, 3.3],
			[30, 40, 2.809],
			[40, 50, 2.318],
			[50, 60, 2.0],
			[60, 70, 1.575]
		]),
		expected: [4.675278024, 56.59308804, 0.0606117644, 2.670102901, 0.06747184666]
	},
	{
		name: 'column-D',
		profile: profile(8, 0.04, [
			[0, 3, 1.41],
			[3, 6, 1.52],
			[6, 9, 1.11],
			[9, 12, 0.83],
			[12, 15, 0.52]
		]),
		expected: [2.177130114, 8.037317642, 0.06027507487, 0.5131623683, 0.02931045694]
	}
] as const;

describe('chloride profile fit against scipy 1.17.1 curve_fit (within 1e-4 relative)', () => {
	it.each(SCIPY_1_17_1)('$name: Cs, Da, their standard errors and the residual SD', (c) => {
		const fit = fitted(fitChlorideProfile(c.profile));
		const ours = [
			fit.surfaceContent,
			fit.dMm2PerYear,
			fit.surfaceContentSe,
			fit.dSeMm2PerYear,
			fit.residualSd
		];
		ours.forEach((value, i) => expect(relative(value, c.expected[i])).toBeLessThan(1e-4));
		expect(fit.points[0].used).toBe(false);
		expect(fit.degreesOfFreedom).toBe(c.profile.increments.length - 3);
		expect(relative(fit.dM2PerS, mm2PerYearToM2PerS(c.expected[1]))).toBeLessThan(1e-4);
	});
});

describe('exact recovery from noiseless profiles', () => {
	it('Cs 3.8, Da 1.2e-12 m²/s at 20 years, Ci 0.06, made with the engine’s erfc: recovered within 1e-6', () => {
		const da = 1.2e-12 * 1e6 * 365.25 * 86400; // 37.86912 mm²/year (Julian year)
		const rows: [number, number, number][] = [[0, 4, 1.0]];
		for (let from = 4; from < 60; from += 6) {
			const x = from + 3;
			rows.push([from, from + 6, 0.06 + (3.8 - 0.06) * erfc(x / (2 * Math.sqrt(da * 20)))]);
		}
		const fit = fitted(fitChlorideProfile(profile(20, 0.06, rows)));
		expect(relative(fit.surfaceContent, 3.8)).toBeLessThan(1e-6);
		expect(relative(fit.dM2PerS, 1.2e-12)).toBeLessThan(1e-6);
		expect(fit.residualSd).toBeLessThan(1e-9);
	});

	it('profile typed from Abramowitz & Stegun Table 7.1 erf values: Cs 3, Da 4 mm²/year recovered within 1e-6', () => {
		// With Da·t = 4 × 25 = 100 mm², x = 2w√(Da·t) = 20w, and C = Ci + (Cs − Ci)(1 − erf(w)).
		// erf(w) from A&S Table 7.1 (10 decimals): erf 0.1 = 0.1124629160, 0.2 = 0.2227025892,
		// 0.5 = 0.5204998778, 1.0 = 0.8427007929, 1.5 = 0.9661051465, 2.0 = 0.9953222650.
		const table: [number, number][] = [
			[0.1, 0.112462916],
			[0.2, 0.2227025892],
			[0.5, 0.5204998778],
			[1.0, 0.8427007929],
			[1.5, 0.9661051465],
			[2.0, 0.995322265]
		];
		const rows: [number, number, number][] = [[0, 1, 2.5]];
		for (const [w, erfW] of table) rows.push([20 * w - 1, 20 * w + 1, 0.1 + 2.9 * (1 - erfW)]);
		const fit = fitted(fitChlorideProfile(profile(25, 0.1, rows)));
		expect(relative(fit.surfaceContent, 3)).toBeLessThan(1e-6);
		expect(relative(fit.dMm2PerYear, 4)).toBeLessThan(1e-6);
		// and the fitted curve passes through the table's points (the engine's erf = A&S to 1e-9)
		for (const [i, [, erfW]] of table.entries())
			expect(fit.points[i + 1].fittedContent).toBeCloseTo(0.1 + 2.9 * (1 - erfW), 9);
	});
});

describe('what the fit leaves out and refuses (ASTM C1556 / NT BUILD 443 exclusion; limits our choice)', () => {
	const base = SCIPY_1_17_1[0].profile;
	it('leaves out the flagged outermost increment, or the shallowest when none is flagged', () => {
		const shuffled = { ...base, increments: [...base.increments].reverse() };
		expect(fitted(fitChlorideProfile(shuffled)).points.filter((p) => !p.used)).toEqual([
			expect.objectContaining({ depthMm: 2.5 })
		]);
		const flagged = {
			...base,
			increments: base.increments.map((inc, i) => ({ ...inc, outermost: i === 1 }))
		};
		const fit = fitted(fitChlorideProfile(flagged));
		expect(fit.points.map((p) => p.used)).toEqual([
			true,
			false,
			true,
			true,
			true,
			true,
			true,
			true
		]);
		const all = fitted(fitChlorideProfile(base, { excludeOutermost: false }));
		expect(all.points.every((p) => p.used)).toBe(true);
	});
	it('refuses fewer than 3 increments after the exclusion, in words', () => {
		const fit = fitChlorideProfile({ ...base, increments: base.increments.slice(0, 3) });
		expect(fit.status).toBe('refused');
		if (fit.status === 'refused') {
			expect(fit.code).toBe('too-few-points');
			expect(fit.reason).toMatch(/Only 2 increments remain.*at least 3/);
		}
	});
	it('refuses a profile whose content does not fall with depth, or stays flat', () => {
		const rising = profile(20, 0.05, [
			[0, 5, 1],
			[5, 10, 0.3],
			[10, 15, 0.6],
			[15, 20, 0.9],
			[20, 25, 1.2]
		]);
		const flat = profile(20, 0.05, [
			[0, 5, 2],
			[5, 10, 2],
			[10, 15, 2],
			[15, 20, 2],
			[20, 25, 1.9999999]
		]);
		for (const p of [rising, flat]) {
			const fit = fitChlorideProfile(p);
			expect(fit.status === 'refused' && fit.code).toBe('no-gradient');
		}
		const atBackground = profile(20, 0.5, [
			[0, 5, 0.4],
			[5, 10, 0.45],
			[10, 15, 0.42],
			[15, 20, 0.3]
		]);
		expect(fitChlorideProfile(atBackground).status).toBe('refused');
	});
	it('warns when few increments are fitted', () => {
		const fit = fitted(fitChlorideProfile(SCIPY_1_17_1[3].profile));
		expect(fit.warnings.join(' ')).toMatch(/Only 4 increments fitted/);
	});
	it('throws on malformed input, naming the field', () => {
		const bad = (changes: Partial<ChlorideProfile>) => () =>
			fitChlorideProfile({ ...base, ...changes });
		expect(bad({ ageYears: 0 })).toThrow(/age at sampling/);
		expect(bad({ ageYears: NaN })).toThrow(/age at sampling/);
		expect(bad({ initialContent: -0.1 })).toThrow(/initial content/);
		expect(bad({ initialContent: undefined })).toThrow(/needs an initial content Ci/);
		expect(bad({ increments: [{ fromMm: 5, toMm: 5, content: 1 }] })).toThrow(
			/increment 1.*deeper/
		);
		expect(bad({ increments: [{ fromMm: 0, toMm: 5, content: NaN }] })).toThrow(
			/increment 1.*content/
		);
		expect(bad({ increments: [{ fromMm: -1, toMm: 5, content: 1 }] })).toThrow(
			/increment 1.*depths/
		);
		expect(() => fitChlorideProfile(base, { ageingExponent: 1 })).toThrow(/ageing exponent/);
	});
	it('records Ci as stated when it comes from the options, measured when the profile says so', () => {
		const { initialContent, ...noCi } = base;
		expect(fitted(fitChlorideProfile(noCi, { initialContent })).initialContent).toEqual({
			value: 0.05,
			basis: 'stated'
		});
		const measured = { ...base, initialContentBasis: 'measured' as const };
		expect(fitted(fitChlorideProfile(measured)).initialContent.basis).toBe('measured');
	});
});

describe('two-parameter Levenberg–Marquardt', () => {
	it('says it did not converge when no step lowers the sum of squares (a Jacobian of the wrong sign)', () => {
		const r = leastSquares2(
			[1, 2, 3],
			(p0, p1, v, d0, d1) => {
				for (let i = 0; i < 3; i++) [v[i], d0[i], d1[i]] = [p0 + i * p1, -1, -i];
			},
			[0, 0]
		);
		expect(r.converged).toBe(false);
	});
	it('solves y = 2x + 1 from five exact points (arithmetic)', () => {
		const x = [0, 1, 2, 3, 4];
		const r = leastSquares2(
			x.map((v) => 2 * v + 1),
			(a, b, v, d0, d1) => {
				for (let i = 0; i < x.length; i++) [v[i], d0[i], d1[i]] = [a * x[i] + b, x[i], 1];
			},
			[0, 0]
		);
		expect(r.converged).toBe(true);
		expect(r.p0).toBeCloseTo(2, 10);
		expect(r.p1).toBeCloseTo(1, 10);
	});
});

describe('units', () => {
	it('0.05 % by mass of concrete with 350 kg/m³ binder in 2400 kg/m³ concrete = 0.05 × 2400/350 = 0.342857 % by binder (arithmetic)', () => {
		expect(chloridePercentOfBinder(0.05, 350, 2400)).toBeCloseTo(0.3428571429, 9);
		expect(() => chloridePercentOfBinder(0.05, 0, 2400)).toThrow(/binder content/);
		expect(() => chloridePercentOfBinder(-1, 350, 2400)).toThrow(/chloride content/);
	});
	it('31.5576 mm²/year = 1e-12 m²/s (Julian year of 365.25 d), the inverse of m2PerSToMm2PerYear', () => {
		expect(mm2PerYearToM2PerS(31.5576)).toBeCloseTo(1e-12, 24);
	});
});
