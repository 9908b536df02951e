/**
 * A measured front: the carbonation rates of test locations or the fitted chloride profiles of
 * one population, reduced to one law per location, depth(t) = a·t^g (mm, t in years):
 * carbonation a = k, g = ½; chloride a = 2z*·√(Da·t_s^α), g = (1 − α)/2, with
 * z* = erfc⁻¹((C_crit − Ci)/(Cs − Ci)), t_s the age at sampling and α the ageing exponent, since
 * D(t)·t = Da·(t_s/t)^α·t (fib Bulletin 34 (2006) ageing law on the apparent coefficient).
 * Depassivation convention, the engine's c_min one: a bar is depassivated when its cover is
 * strictly less than the front depth; a cover equal to the front is still protected.
 */
import { erfcInverse } from '../normalDistribution';
import type { CarbonationRate } from './carbonationRates';
import type { CountBelow } from './coverIndex';
import type { ChlorideFit, ChlorideFitted } from './chlorideProfileFit';

export type MeasuredFront =
	| { kind: 'carbonation'; rates: readonly CarbonationRate[] }
	| {
			kind: 'chloride';
			/** Fits of the population's profiles; refused ones are left out and counted. */
			fits: readonly ChlorideFit[];
			/** C_crit, same unit as the profiles (% by mass of binder); an assumption, stated. */
			criticalContent: number;
	  };

/** One location's front law with what its parameters are known to within. */
export interface FrontSource {
	label?: string;
	/** a in depth = a·t^g (mm/year^g); Infinity when C_crit ≤ Ci (every depth is past C_crit). */
	coefficient: number;
	exponent: number;
	carbonation?: { k: number; se: number };
	chloride?: ChlorideFitted;
}

/** Front coefficient of a chloride profile; Infinity when C_crit ≤ Ci, 0 when Cs ≤ C_crit. */
export function chlorideFrontCoefficient(
	surfaceContent: number,
	initialContent: number,
	criticalContent: number,
	dMm2PerYear: number,
	sampledAgeYears: number,
	ageingExponent: number
): number {
	if (criticalContent <= initialContent) return Infinity;
	if (surfaceContent <= criticalContent || !(dMm2PerYear > 0)) return 0;
	const z = erfcInverse((criticalContent - initialContent) / (surfaceContent - initialContent));
	return 2 * z * Math.sqrt(dMm2PerYear * Math.pow(sampledAgeYears, ageingExponent));
}

/** Depth of a front law at an age (mm). Cost O(1). */
export function frontDepthMm(coefficient: number, exponent: number, ageYears: number): number {
	if (coefficient === Infinity) return Infinity;
	return coefficient * Math.pow(ageYears, exponent);
}

function chlorideSource(fit: ChlorideFitted, criticalContent: number): FrontSource {
	const coefficient = chlorideFrontCoefficient(
		fit.surfaceContent,
		fit.initialContent.value,
		criticalContent,
		fit.dMm2PerYear,
		fit.ageYears,
		fit.ageingExponent
	);
	return { label: fit.label, coefficient, exponent: (1 - fit.ageingExponent) / 2, chloride: fit };
}

/**
 * The front laws of a measured front; throws when nothing usable is left (no rates, or every
 * profile refused) or C_crit is not a number ≥ 0.
 */
export function frontSources(front: MeasuredFront): { sources: FrontSource[]; refused: number } {
	if (front.kind === 'carbonation') {
		if (front.rates.length === 0) throw new Error('a carbonation front needs at least 1 test');
		const sources = front.rates.map((r) => ({
			label: r.label,
			coefficient: r.kMmPerSqrtYear,
			exponent: 0.5,
			carbonation: { k: r.kMmPerSqrtYear, se: r.kStandardError ?? 0 }
		}));
		return { sources, refused: 0 };
	}
	if (!(Number.isFinite(front.criticalContent) && front.criticalContent >= 0))
		throw new Error('critical chloride content C_crit must be a number ≥ 0');
	const fitted = front.fits.filter((f): f is ChlorideFitted => f.status === 'fitted');
	if (fitted.length === 0)
		throw new Error('a chloride front needs at least 1 fitted profile (every profile was refused)');
	return {
		sources: fitted.map((f) => chlorideSource(f, front.criticalContent)),
		refused: front.fits.length - fitted.length
	};
}

/** Throw unless every age is a number of years ≥ 0. */
export function checkAges(agesYears: readonly number[]): void {
	agesYears.forEach((t, i) => {
		if (!(Number.isFinite(t) && t >= 0))
			throw new Error(`age ${i + 1} must be a number of years ≥ 0`);
	});
}

/**
 * Share of sorted covers depassivated when the front is equally likely to be any source's:
 * (1/m)·Σ_j #(cover < depth_j(t))/n. `shiftMm` and `spread` move the covers as the
 * sensitivity needs (cover' = mean + spread·(cover − mean) + shift). `countBelow` is a
 * coverCounter of the n sorted covers. Cost O(m) counts.
 */
export function shareBelowFronts(
	countBelow: CountBelow,
	n: number,
	coefficients: ArrayLike<number>,
	exponents: ArrayLike<number>,
	ageYears: number,
	coverMove: { shiftMm: number; spread: number; meanMm: number } | null = null
): number {
	let total = 0;
	for (let j = 0; j < coefficients.length; j++) {
		let depth = frontDepthMm(coefficients[j], exponents[j], ageYears);
		if (coverMove && Number.isFinite(depth))
			depth = coverMove.meanMm + (depth - coverMove.shiftMm - coverMove.meanMm) / coverMove.spread;
		total += countBelow(depth);
	}
	return total / (coefficients.length * n);
}
