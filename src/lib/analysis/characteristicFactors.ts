/**
 * Factors k for a lower characteristic value x̄ − k·s from a finite sample.
 */
import jStat from 'jstat';
import { noncentralTCdf } from './noncentralT';
import { normalCdf, normalQuantile } from './normalDistribution';
import { requireOpenUnit, requireSampleSize } from './readings';
import { remember } from './remember';
import { solveMonotone } from './solve';

/**
 * Prediction factor k_n of EN 1990 Annex D (D7.2, Table D1, "V_x unknown"):
 * k_n = t(1 − p; n − 1)·√(1 + 1/n), Student's t quantile from jstat. At n = ∞ (Table D1's
 * last column, σ known) k_n = z(1 − p). Dimensionless. Cost O(1). Needs 2 readings, a whole
 * number of them, and 0 < p < 1.
 * @example predictionFactor(10, 0.05) // 1.9230 (Table D1: 1.92)
 */
export function predictionFactor(n: number, p = 0.05): number {
	requireSampleSize('predictionFactor', n, 2, true);
	requireOpenUnit('predictionFactor', 'p', p);
	if (n === Infinity) return normalQuantile(1 - p);
	return jStat.studentt.inv(1 - p, n - 1) * Math.sqrt(1 + 1 / n);
}

/**
 * One-sided tolerance factor k such that x̄ − k·s lies below at least 1 − p of the population
 * with confidence γ (ISO 16269-6; NIST/SEMATECH e-Handbook §7.2.6.3):
 * k = t'⁻¹(γ; ν = n − 1, δ = z(1 − p)·√n)/√n, the noncentral t quantile found numerically.
 * Dimensionless. Cost ≈ 10 noncentral t CDFs the first time for given n, p, γ; remembered
 * after that (a pure function of the three). Needs 2 readings (a whole number), 0 < p < 1 and
 * 0 < γ < 1.
 * @example toleranceFactor(10, 0.05, 0.95) // 2.911
 */
export function toleranceFactor(n: number, p = 0.05, confidence = 0.95): number {
	requireSampleSize('toleranceFactor', n, 2);
	requireOpenUnit('toleranceFactor', 'p', p);
	requireOpenUnit('toleranceFactor', 'confidence', confidence);
	return rememberedToleranceFactor(n, p, confidence);
}

const rememberedToleranceFactor = remember(solveToleranceFactor);

function solveToleranceFactor(n: number, p: number, confidence: number): number {
	const dof = n - 1;
	const ncp = normalQuantile(1 - p) * Math.sqrt(n);
	const spread = Math.sqrt(1 + (ncp * ncp) / (2 * dof));
	const guess = ncp + normalQuantile(confidence) * spread;
	const t = solveMonotone(
		(x) => noncentralTCdf(x, dof, ncp),
		confidence,
		guess - spread,
		guess + spread
	);
	return t / Math.sqrt(n);
}

/**
 * Upper confidence bound on the fraction of a normal population below a limit L, from x̄, s, n
 * (the variables method, ISO 3951 / ISO 16269-6 logic): with t = √n·(x̄ − L)/s, find δ_L such
 * that P(T'(ν, δ_L) ≤ t) = γ; then p_U = Φ(−δ_L/√n). Dimensionless fraction.
 * Cost ≈ 10 noncentral t CDFs the first time for given arguments, remembered after that.
 * Needs 2 readings (a whole number), 0 < γ < 1 and finite figures.
 * @example fractionBelowUpperBound(62.195, 9.9676, 200, 45, 0.95) // ≈ 0.07
 */
export function fractionBelowUpperBound(
	meanValue: number,
	sdValue: number,
	n: number,
	limit: number,
	confidence = 0.95
): number {
	requireSampleSize('fractionBelowUpperBound', n, 2);
	requireOpenUnit('fractionBelowUpperBound', 'confidence', confidence);
	if (![meanValue, sdValue, limit].every(Number.isFinite) || sdValue < 0)
		throw new Error('fractionBelowUpperBound needs a finite mean and limit and an SD ≥ 0');
	return rememberedUpperBound(meanValue, sdValue, n, limit, confidence);
}

const rememberedUpperBound = remember(solveUpperBound);

function solveUpperBound(
	meanValue: number,
	sdValue: number,
	n: number,
	limit: number,
	confidence: number
): number {
	if (!(sdValue > 0)) return meanValue >= limit ? 0 : 1;
	const dof = n - 1;
	const t = (Math.sqrt(n) * (meanValue - limit)) / sdValue;
	const spread = Math.sqrt(1 + (t * t) / (2 * dof));
	const guess = t - normalQuantile(confidence) * spread;
	// The CDF falls as δ grows, so solve on −δ to keep the function increasing.
	const minusDelta = solveMonotone(
		(d) => noncentralTCdf(t, dof, -d),
		confidence,
		-guess - spread,
		-guess + spread
	);
	return normalCdf(minusDelta / Math.sqrt(n));
}
