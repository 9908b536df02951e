/**
 * Kolmogorov–Smirnov distance with estimated parameters (Lilliefors' test).
 * p-value: G. E. Dallal & L. Wilkinson, "An analytic approximation to the distribution of
 * Lilliefors's test statistic for normality", The American Statistician 40 (1986) 294–296, valid
 * for p < 0.1; above it the modified-statistic polynomial of Stephens (1974) as R's nortest
 * lillie.test uses. Our own code: the packages have no Lilliefors p-value, and the classical
 * Kolmogorov p-value is far too lenient once μ and σ come from the same data.
 */
import type { FittedModel } from './fitModels';
import { modelProbabilities } from './modelProbabilities';
import { requireReadings } from './readings';

export interface KolmogorovSmirnovResult {
	/** D = max over i of max(i/n − F(x(i)), F(x(i)) − (i − 1)/n). */
	statistic: number;
	/** Lilliefors p-value (see the module comment). */
	pValue: number;
}

/** Lilliefors p-value of D for n readings (Dallal & Wilkinson 1986; Stephens 1974 above 0.1). */
export function lillieforsPValue(d: number, n: number): number {
	const [kd, nd] = n <= 100 ? [d, n] : [d * Math.pow(n / 100, 0.49), 100];
	let p = Math.exp(
		-7.01256 * kd * kd * (nd + 2.78019) +
			2.99587 * kd * Math.sqrt(nd + 2.78019) -
			0.122119 +
			0.974598 / Math.sqrt(nd) +
			1.67997 / nd
	);
	if (p > 0.1) {
		const k = (Math.sqrt(n) - 0.01 + 0.85 / Math.sqrt(n)) * d;
		if (k <= 0.302) p = 1;
		else if (k <= 0.5)
			p = 2.76773 - 19.828315 * k + 80.709644 * k ** 2 - 138.55152 * k ** 3 + 81.218052 * k ** 4;
		else if (k <= 0.9)
			p = -4.901232 + 40.662806 * k - 97.490286 * k ** 2 + 94.029866 * k ** 3 - 32.355711 * k ** 4;
		else if (k <= 1.31)
			p = 6.198765 - 19.558097 * k + 23.186922 * k ** 2 - 12.234627 * k ** 3 + 2.423045 * k ** 4;
		else p = 0;
	}
	return Math.min(1, Math.max(0, p));
}

/**
 * Kolmogorov–Smirnov statistic from the model CDF of sorted readings, with its Lilliefors
 * p-value. Cost O(n). Needs 5 readings.
 */
export function kolmogorovSmirnovFromCdf(cdf: Float64Array): KolmogorovSmirnovResult {
	const n = cdf.length;
	requireReadings('kolmogorovSmirnov', n, 5);
	let d = 0;
	for (let i = 0; i < n; i++) {
		const f = cdf[i];
		d = Math.max(d, (i + 1) / n - f, f - i / n);
	}
	return { statistic: d, pValue: lillieforsPValue(d, n) };
}

/**
 * Kolmogorov–Smirnov statistic of sorted readings against a fitted model, with its Lilliefors
 * p-value (for the lognormal, on ln x). Cost O(n), one erfc a reading. Needs 5 readings.
 * @example kolmogorovSmirnov(sorted, fitNormal(sorted)).statistic // e.g. 0.07
 */
export function kolmogorovSmirnov(sorted: Float64Array, fit: FittedModel): KolmogorovSmirnovResult {
	requireReadings('kolmogorovSmirnov', sorted.length, 5);
	return kolmogorovSmirnovFromCdf(modelProbabilities(sorted, fit).cdf);
}
