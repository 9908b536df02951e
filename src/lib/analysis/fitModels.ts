/**
 * Normal and lognormal models of a cover population.
 */
import { normalCdf, normalPdf } from './normalDistribution';
import { requireReadings } from './readings';

export type ModelName = 'normal' | 'lognormal';

/**
 * A fitted model. For 'normal' the location/scale are μ, σ in mm; for 'lognormal' they are the
 * mean and SD of ln(cover/mm).
 */
export interface FittedModel {
	model: ModelName;
	location: number;
	scale: number;
}

/**
 * Mean and sample SD (n − 1) of values, one pass each (Welford-free: two-pass for accuracy).
 * Cost O(n). Mapped through ln when `logarithm` is true.
 */
function meanAndSd(sorted: Float64Array, logarithm: boolean): [number, number] {
	const n = sorted.length;
	// Readings all equal: the spread is exactly 0 (summing would leave a rounding residue).
	if (sorted[0] === sorted[n - 1]) return [logarithm ? Math.log(sorted[0]) : sorted[0], 0];
	let sum = 0;
	for (let i = 0; i < n; i++) sum += logarithm ? Math.log(sorted[i]) : sorted[i];
	const mean = sum / n;
	let squares = 0;
	for (let i = 0; i < n; i++) {
		const d = (logarithm ? Math.log(sorted[i]) : sorted[i]) - mean;
		squares += d * d;
	}
	return [mean, Math.sqrt(squares / (n - 1))];
}

/**
 * Fit a normal model: μ = x̄, σ = s (sample SD, n − 1), as EN 1990 Annex D and ISO 16269-6 use.
 * Units mm. Cost O(n). Needs 2 readings.
 * @example fitNormal(Float64Array.of(40, 45, 50)) // { model: 'normal', location: 45, scale: 5 }
 */
export function fitNormal(sorted: Float64Array): FittedModel {
	requireReadings('fitNormal', sorted.length, 2);
	const [location, scale] = meanAndSd(sorted, false);
	return { model: 'normal', location, scale };
}

/**
 * Fit a lognormal model: μ_ln, σ_ln = mean and sample SD of ln(cover) (EN 1990 D7.3 works on
 * ln x the same way). Cost O(n) with 2n logarithms. Needs 2 readings, all > 0 mm.
 * @example fitLognormal(Float64Array.of(40, 45, 50)).location // ≈ 3.8042
 */
export function fitLognormal(sorted: Float64Array): FittedModel {
	requireReadings('fitLognormal', sorted.length, 2);
	if (!(sorted[0] > 0)) throw new Error('fitLognormal needs every reading above 0 mm');
	const [location, scale] = meanAndSd(sorted, true);
	return { model: 'lognormal', location, scale };
}

/**
 * Standardised variate of a cover under a model: (x − μ)/σ or (ln x − μ_ln)/σ_ln. A model
 * with σ = 0 (every reading equal) is a point: −∞ below it, +∞ at or above it, so its CDF is
 * the step 0 → 1 at the point and never 0/0.
 */
export function standardise(fit: FittedModel, coverMm: number): number {
	const x = fit.model === 'normal' ? coverMm : coverMm > 0 ? Math.log(coverMm) : -Infinity;
	if (fit.scale === 0) return x < fit.location ? -Infinity : Infinity;
	return (x - fit.location) / fit.scale;
}

/** Model CDF F(x) at a cover in mm. @example modelCdf({model:'normal',location:45,scale:5}, 45) // 0.5 */
export function modelCdf(fit: FittedModel, coverMm: number): number {
	return normalCdf(standardise(fit, coverMm));
}

/**
 * Share of the model strictly below a limit, P(X < limit): F(limit) for a spread model; for a
 * point (σ = 0) 1 when the point is below the limit, else 0 — a cover equal to the limit
 * complies, as a reading equal to c_min does.
 */
export function modelShareBelow(fit: FittedModel, limitMm: number): number {
	if (fit.scale > 0) return modelCdf(fit, limitMm);
	// Compared on the model's own scale: e^(ln x) need not give x back exactly.
	const limit = fit.model === 'normal' ? limitMm : limitMm > 0 ? Math.log(limitMm) : -Infinity;
	return fit.location < limit ? 1 : 0;
}

/** Model density f(x) in 1/mm. Lognormal: φ(z)/(σ_ln·x). */
export function modelPdf(fit: FittedModel, coverMm: number): number {
	if (!(fit.scale > 0)) return 0;
	const z = standardise(fit, coverMm);
	if (fit.model === 'normal') return normalPdf(z) / fit.scale;
	return coverMm > 0 ? normalPdf(z) / (fit.scale * coverMm) : 0;
}

/** Model quantile x_q in mm: μ + z_q·σ or exp(μ_ln + z_q·σ_ln), for a standard normal z_q. */
export function modelQuantile(fit: FittedModel, zq: number): number {
	const v = fit.location + zq * fit.scale;
	return fit.model === 'normal' ? v : Math.exp(v);
}
