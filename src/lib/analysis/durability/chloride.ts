/**
 * Chloride ingress by the error-function solution of Fick's second law (Crank, The Mathematics
 * of Diffusion, 2nd ed. 1975, Eq. 3.13 form), with the ageing of the apparent diffusion
 * coefficient used in fib Bulletin 34 (2006): D(t) = D_ref·(t_ref/t)^α.
 * Units: depth mm, time years, D mm²/year, contents in any one unit (e.g. % by mass of binder).
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

/** D(t) = D_ref·(t_ref/t)^α (mm²/year). @example apparentDiffusionMm2PerYear(m, 64) */
export function apparentDiffusionMm2PerYear(model: ChlorideModel, ageYears: number): number {
	const alpha = model.ageingExponent ?? 0;
	if (!(alpha >= 0 && alpha < 1)) throw new Error('chloride ageing exponent must be in [0, 1)');
	if (alpha === 0) return model.dRefMm2PerYear;
	return model.dRefMm2PerYear * Math.pow((model.tRefYears ?? 28 / 365.25) / ageYears, alpha);
}

/**
 * C(x, t) = C0 + (Cs − C0)·(1 − erf(x / (2√(D(t)·t)))).
 * @example chlorideContentAt({ surfaceContent: 3, initialContent: 0.1, dRefMm2PerYear: 32, criticalContent: 0.6 }, 40, 50) // 1.49055
 */
export function chlorideContentAt(model: ChlorideModel, depthMm: number, ageYears: number): number {
	if (!(ageYears > 0)) return depthMm <= 0 ? model.surfaceContent : model.initialContent;
	const spread = 2 * Math.sqrt(apparentDiffusionMm2PerYear(model, ageYears) * ageYears);
	return (
		model.initialContent + (model.surfaceContent - model.initialContent) * erfc(depthMm / spread)
	);
}

/** z* with erfc(z*) = (C_crit − C0)/(Cs − C0); null when C_crit is never reached. */
function criticalArgument(model: ChlorideModel): number | null {
	const ratio =
		(model.criticalContent - model.initialContent) / (model.surfaceContent - model.initialContent);
	if (!(ratio > 0 && ratio < 1)) return ratio <= 0 ? 0 : null;
	return erfcInverse(ratio);
}

/**
 * Depth (mm) at which C reaches C_crit at age t: x_crit = 2·z*·√(D(t)·t). null if never.
 * @example chlorideCriticalDepthMm(model, 50)
 */
export function chlorideCriticalDepthMm(model: ChlorideModel, ageYears: number): number | null {
	const z = criticalArgument(model);
	if (z === null) return null;
	return 2 * z * Math.sqrt(apparentDiffusionMm2PerYear(model, ageYears) * ageYears);
}

/**
 * Years until C(cover, t) = C_crit. With D(t) = D_ref(t_ref/t)^α, D(t)·t = D_ref·t_ref^α·t^(1−α),
 * so t = ((cover/(2z*))² / (D_ref·t_ref^α))^(1/(1−α)). null when C_crit is never reached.
 */
export function chlorideTimeToDepassivationYears(
	model: ChlorideModel,
	coverMm: number
): number | null {
	const z = criticalArgument(model);
	if (z === null) return null;
	if (z === 0) return 0;
	const alpha = model.ageingExponent ?? 0;
	const tRef = model.tRefYears ?? 28 / 365.25;
	const needed = Math.pow(Math.max(0, coverMm) / (2 * z), 2);
	return Math.pow(needed / (model.dRefMm2PerYear * Math.pow(tRef, alpha)), 1 / (1 - alpha));
}
