/**
 * Chloride ingress by the error-function solution of Fick's second law (Crank, The Mathematics
 * of Diffusion, 2nd ed. 1975, Eq. 3.13 form), with the ageing of the apparent diffusion
 * coefficient used in fib Bulletin 34 (2006): D(t) = D_ref·(t_ref/t)^α.
 * Units: depth mm, time years, D mm²/year, contents in any one unit (e.g. % by mass of binder).
 * Inputs are checked: a negative D, age or depth, or a NaN, is an error naming the figure,
 * never a silent NaN or "never".
 */
import { erfc, erfcInverse } from '../normalDistribution';

export interface ChlorideModel {
	/** Surface content C_s. */
	surfaceContent: number;
	/** Initial content C_0 of the concrete. */
	initialContent: number;
	/** Apparent diffusion coefficient D_ref at t_ref (mm²/year). */
	dRefMm2PerYear: number;
	/** Reference age t_ref (years), default 28 days = 28/365.25. Only matters when α > 0. */
	tRefYears?: number;
	/** Ageing exponent α, 0 ≤ α < 1 (0 = constant D). */
	ageingExponent?: number;
	/** Critical content C_crit at which the steel depassivates. */
	criticalContent: number;
}

/** Seconds in a Julian year (365.25 d), for the conversion from m²/s. */
const SECONDS_PER_YEAR = 365.25 * 86400;

/** Convert a diffusion coefficient from m²/s to mm²/year. @example m2PerSToMm2PerYear(1e-12) // 31.5576 */
export function m2PerSToMm2PerYear(dM2PerS: number): number {
	return dM2PerS * 1e6 * SECONDS_PER_YEAR;
}

/** Convert a diffusion coefficient from mm²/year to m²/s. @example mm2PerYearToM2PerS(31.5576) // 1e-12 */
export function mm2PerYearToM2PerS(dMm2PerYear: number): number {
	return dMm2PerYear / (1e6 * SECONDS_PER_YEAR);
}

function requireAtLeastZero(what: string, value: number): void {
	if (!(value >= 0 && Number.isFinite(value)))
		throw new Error(`chloride model needs ${what} to be a finite number ≥ 0, not ${value}`);
}

/** Check every figure of a chloride model; throws naming the first bad one. */
export function checkChlorideModel(model: ChlorideModel): void {
	requireAtLeastZero('the surface content C_s', model.surfaceContent);
	requireAtLeastZero('the initial content C_0', model.initialContent);
	requireAtLeastZero('the critical content C_crit', model.criticalContent);
	requireAtLeastZero('the diffusion coefficient D', model.dRefMm2PerYear);
	const alpha = model.ageingExponent ?? 0;
	if (!(alpha >= 0 && alpha < 1)) throw new Error('chloride ageing exponent must be in [0, 1)');
	const tRef = model.tRefYears ?? 28 / 365.25;
	if (!(tRef > 0 && Number.isFinite(tRef)))
		throw new Error(`chloride model needs a reference age t_ref > 0 years, not ${tRef}`);
}

/** D(t) = D_ref·(t_ref/t)^α (mm²/year); infinite at t = 0 with ageing, so refused there. */
export function apparentDiffusionMm2PerYear(model: ChlorideModel, ageYears: number): number {
	checkChlorideModel(model);
	requireAtLeastZero('the age t (years)', ageYears);
	const alpha = model.ageingExponent ?? 0;
	if (alpha === 0) return model.dRefMm2PerYear;
	if (ageYears === 0) throw new Error('with ageing (α > 0) D(t) is infinite at t = 0 years');
	return model.dRefMm2PerYear * Math.pow((model.tRefYears ?? 28 / 365.25) / ageYears, alpha);
}

/** D(t)·t = D_ref·t_ref^α·t^(1−α) (mm²), which goes to 0 at t = 0 even with ageing. */
function diffusionTimeMm2(model: ChlorideModel, ageYears: number): number {
	const alpha = model.ageingExponent ?? 0;
	const tRef = model.tRefYears ?? 28 / 365.25;
	return model.dRefMm2PerYear * Math.pow(tRef, alpha) * Math.pow(ageYears, 1 - alpha);
}

/**
 * C(x, t) = C0 + (Cs − C0)·(1 − erf(x / (2√(D(t)·t)))); at t = 0 (or D = 0) the initial content
 * inside and C_s at the surface. Throws on a negative depth or age.
 * @example chlorideContentAt({ surfaceContent: 3, initialContent: 0.1, dRefMm2PerYear: 32, criticalContent: 0.6 }, 40, 50) // 1.49055
 */
export function chlorideContentAt(model: ChlorideModel, depthMm: number, ageYears: number): number {
	checkChlorideModel(model);
	requireAtLeastZero('the depth x (mm)', depthMm);
	requireAtLeastZero('the age t (years)', ageYears);
	const spread = 2 * Math.sqrt(diffusionTimeMm2(model, ageYears));
	if (spread === 0) return depthMm === 0 ? model.surfaceContent : model.initialContent;
	return (
		model.initialContent + (model.surfaceContent - model.initialContent) * erfc(depthMm / spread)
	);
}

/**
 * z* with erfc(z*) = (C_crit − C0)/(Cs − C0): 'already' when C_crit ≤ C0 (the concrete was
 * never below the critical content, so the steel is depassivated at any depth), null when
 * C_crit is never reached (C_s ≤ C_crit).
 */
function criticalArgument(model: ChlorideModel): number | 'already' | null {
	checkChlorideModel(model);
	if (model.criticalContent <= model.initialContent) return 'already';
	if (model.surfaceContent <= model.criticalContent) return null;
	const ratio =
		(model.criticalContent - model.initialContent) / (model.surfaceContent - model.initialContent);
	return erfcInverse(ratio);
}

/**
 * Depth (mm) at which C reaches C_crit at age t: x_crit = 2·z*·√(D(t)·t). null if never;
 * Infinity when C_crit ≤ C0 (every depth is past the critical content).
 * @example chlorideCriticalDepthMm(model, 50)
 */
export function chlorideCriticalDepthMm(model: ChlorideModel, ageYears: number): number | null {
	requireAtLeastZero('the age t (years)', ageYears);
	const z = criticalArgument(model);
	if (z === 'already') return Infinity;
	if (z === null) return null;
	return 2 * z * Math.sqrt(diffusionTimeMm2(model, ageYears));
}

/**
 * Years until C(cover, t) = C_crit. With D(t) = D_ref(t_ref/t)^α, D(t)·t = D_ref·t_ref^α·t^(1−α),
 * so t = ((cover/(2z*))² / (D_ref·t_ref^α))^(1/(1−α)). 0 when C_crit ≤ C0; null when C_crit is
 * never reached (or D = 0). Throws on a negative cover.
 */
export function chlorideTimeToDepassivationYears(
	model: ChlorideModel,
	coverMm: number
): number | null {
	requireAtLeastZero('the cover (mm)', coverMm);
	const z = criticalArgument(model);
	if (z === 'already') return 0;
	if (z === null || model.dRefMm2PerYear === 0) return null;
	const alpha = model.ageingExponent ?? 0;
	const tRef = model.tRefYears ?? 28 / 365.25;
	const needed = Math.pow(coverMm / (2 * z), 2);
	return Math.pow(needed / (model.dRefMm2PerYear * Math.pow(tRef, alpha)), 1 / (1 - alpha));
}
