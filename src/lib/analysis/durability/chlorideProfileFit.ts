/**
 * Fitting a measured chloride profile: apparent surface content Cs and apparent diffusion
 * coefficient Da of C(x, t) = Ci + (Cs − Ci)·erfc(x/(2√(Da·t))) (Crank 1975, Eq. 3.13 form), by
 * nonlinear least squares on the increments' mid-depths, the outermost increment left out as
 * ASTM C1556 and NT BUILD 443 do (the skin is disturbed by washing-out and carbonation).
 * Standard errors as scipy's curve_fit with absolute_sigma=False: cov = s²·(JᵀJ)⁻¹ at the
 * optimum, s² = Σr²/(n − 2). Units: depth mm, age years, Da mm²/year (and m²/s), contents in
 * one unit throughout (% by mass of binder; see chloridePercentOfBinder).
 */
import { erfc } from '../normalDistribution';
import { mm2PerYearToM2PerS } from './chloride';
import { leastSquares2 } from './leastSquares2';
import { chlorideStartingValues } from './chlorideStart';
import { determinedWithin, fitWarnings, hasGradient, identifiable } from './chlorideFitChecks';
import {
	type ChlorideFitPoint,
	type ChlorideProfile,
	type InitialContent,
	MIN_FITTED_INCREMENTS,
	checkAgeing,
	checkProfile,
	choosePoints,
	initialContentOf
} from './chlorideProfile';
import type { ChlorideModel } from './chloride';

export interface ChlorideFitOptions {
	/** Ci used when the profile gives none (stated). */
	initialContent?: number;
	/** Leave out the outermost increment (default true, as ASTM C1556 and NT BUILD 443). */
	excludeOutermost?: boolean;
	/** Ageing exponent α for projections, D(t) = Da·(t_test/t)^α; stated, default 0. */
	ageingExponent?: number;
}

interface FitCommon {
	memberId?: number | string;
	label?: string;
	ageYears: number;
	initialContent: InitialContent;
	ageingExponent: number;
	points: ChlorideFitPoint[];
}

export interface ChlorideFitted extends FitCommon {
	status: 'fitted';
	surfaceContent: number;
	surfaceContentSe: number;
	/** Da at the age of sampling. */
	dMm2PerYear: number;
	dSeMm2PerYear: number;
	dM2PerS: number;
	dSeM2PerS: number;
	/** Correlation of the estimates of Cs and Da. */
	correlation: number;
	residualSd: number;
	degreesOfFreedom: number;
	iterations: number;
	warnings: string[];
}

export interface ChlorideFitRefused extends FitCommon {
	status: 'refused';
	code: 'too-few-points' | 'no-gradient' | 'not-converged' | 'undetermined';
	/** Plain words for the engineer. */
	reason: string;
}

export type ChlorideFit = ChlorideFitted | ChlorideFitRefused;

function refuse(
	common: FitCommon,
	code: ChlorideFitRefused['code'],
	reason: string
): ChlorideFitRefused {
	return { ...common, status: 'refused', code, reason };
}

/**
 * Fit Cs and Da to one measured profile (see the file comment for the method).
 * Returns status 'fitted' with Cs, Da (mm²/year and m²/s), their standard errors, correlation,
 * residual SD and warnings; or status 'refused' with a plain reason when fewer than 3
 * increments remain, the contents do not fall with depth, the search does not converge, or
 * the fitted curve is flat (or spent) over the sampled depths so Da (or Cs) is not determined.
 * Throws on malformed input (a depth, content or age that is not a number ≥ 0). Cost O(n) a
 * step, ≈ 10 steps.
 * @example fitChlorideProfile({ ageYears: 25, initialContent: 0.05, increments }).dMm2PerYear
 */
export function fitChlorideProfile(
	profile: ChlorideProfile,
	options: ChlorideFitOptions = {}
): ChlorideFit {
	checkProfile(profile);
	const ci = initialContentOf(profile, options.initialContent);
	const points = choosePoints(profile, options.excludeOutermost ?? true);
	const common: FitCommon = {
		...(profile.memberId === undefined ? {} : { memberId: profile.memberId }),
		...(profile.label === undefined ? {} : { label: profile.label }),
		ageYears: profile.ageYears,
		initialContent: ci,
		ageingExponent: checkAgeing(options.ageingExponent ?? 0),
		points
	};
	const used = points.filter((p) => p.used);
	if (used.length < MIN_FITTED_INCREMENTS)
		return refuse(
			common,
			'too-few-points',
			`Only ${used.length} increments remain after leaving out the outermost one; a fit of ` +
				`surface content and diffusion coefficient needs at least ${MIN_FITTED_INCREMENTS}.`
		);
	const x = Float64Array.from(used, (p) => p.depthMm);
	const y = Float64Array.from(used, (p) => p.content);
	if (!hasGradient(x, y, ci.value))
		return refuse(
			common,
			'no-gradient',
			'The chloride content does not fall with depth (or stays at the initial content), so ' +
				'there is no diffusion profile to fit.'
		);
	return solveProfile(common, x, y);
}

function solveProfile(common: FitCommon, x: Float64Array, y: Float64Array): ChlorideFit {
	const ci = common.initialContent.value;
	const t = common.ageYears;
	// Fitted on ln Da so the search never tries Da ≤ 0; the optimum is the same point.
	const model = (cs: number, lnD: number, v: Float64Array, d0: Float64Array, d1: Float64Array) => {
		const scale = 1 / (2 * Math.sqrt(Math.exp(lnD) * t));
		for (let i = 0; i < x.length; i++) {
			const w = x[i] * scale;
			const e = erfc(w);
			v[i] = ci + (cs - ci) * e;
			d0[i] = e;
			d1[i] = ((cs - ci) * w * Math.exp(-w * w)) / Math.sqrt(Math.PI);
		}
	};
	const start = chlorideStartingValues(x, y, ci, t);
	const r = leastSquares2(y, model, [start.surfaceContent, Math.log(start.dMm2PerYear)]);
	const da = Math.exp(r.p1);
	if (!r.converged || !Number.isFinite(da) || !Number.isFinite(r.p0))
		return refuse(
			common,
			'not-converged',
			'The least-squares search did not settle on a surface content and diffusion coefficient; ' +
				'the profile may be too irregular for the error-function model.'
		);
	if (!(r.p0 > ci))
		return refuse(
			common,
			'no-gradient',
			'The fitted surface content is not above the initial content: no chloride ingress to fit.'
		);
	const undetermined = determinedWithin(x, da, t) ?? identifiable(r.jtj);
	if (undetermined) return refuse(common, undetermined.code, undetermined.reason);
	return fittedResult(common, x, y, r.p0, da, r);
}

function fittedResult(
	common: FitCommon,
	x: Float64Array,
	y: Float64Array,
	cs: number,
	da: number,
	r: ReturnType<typeof leastSquares2>
): ChlorideFitted {
	const dof = x.length - 2;
	const s2 = r.sumOfSquares / dof;
	// JᵀJ on (Cs, ln Da) → on (Cs, Da): the Da column of J is the ln Da column divided by Da.
	const [a00, a01u, a11u] = r.jtj;
	const a01 = a01u / da;
	const a11 = a11u / (da * da);
	const det = a00 * a11 - a01 * a01;
	const varCs = (s2 * a11) / det;
	const varDa = (s2 * a00) / det;
	const cov = (-s2 * a01) / det;
	const ci = common.initialContent.value;
	const scale = 1 / (2 * Math.sqrt(da * common.ageYears));
	const points = common.points.map((p) => ({
		depthMm: p.depthMm,
		content: p.content,
		used: p.used,
		fittedContent: ci + (cs - ci) * erfc(p.depthMm * scale)
	}));
	const seCs = Math.sqrt(Math.max(0, varCs));
	const seDa = Math.sqrt(Math.max(0, varDa));
	return {
		...common,
		points,
		status: 'fitted',
		surfaceContent: cs,
		surfaceContentSe: seCs,
		dMm2PerYear: da,
		dSeMm2PerYear: seDa,
		dM2PerS: mm2PerYearToM2PerS(da),
		dSeM2PerS: mm2PerYearToM2PerS(seDa),
		correlation: seCs > 0 && seDa > 0 ? cov / (seCs * seDa) : 0,
		residualSd: Math.sqrt(s2),
		degreesOfFreedom: dof,
		iterations: r.iterations,
		warnings: fitWarnings(x.length, cs, seCs, da, seDa, y)
	};
}

/**
 * The fitted profile as the engine's ChlorideModel (chloride.ts), so chlorideContentAt draws
 * the fitted curve and the existing time-to-depassivation functions apply: D_ref = Da at
 * t_ref = the age at sampling, with the fit's ageing exponent.
 * @example chlorideContentAt(chlorideModelFromFit(fit, 0.6), 30, fit.ageYears)
 */
export function chlorideModelFromFit(fit: ChlorideFitted, criticalContent: number): ChlorideModel {
	return {
		surfaceContent: fit.surfaceContent,
		initialContent: fit.initialContent.value,
		dRefMm2PerYear: fit.dMm2PerYear,
		tRefYears: fit.ageYears,
		ageingExponent: fit.ageingExponent,
		criticalContent
	};
}
