/**
 * Exact (Clopper–Pearson) confidence limits for a binomial proportion.
 * Reference: C. J. Clopper & E. S. Pearson, Biometrika 26 (1934) 404–413. Beta quantiles: jstat.
 */
import jStat from 'jstat';

function checkCounts(count: number, n: number, confidence: number): void {
	if (!(Number.isInteger(count) && Number.isInteger(n) && n >= 1 && count >= 0 && count <= n)) {
		throw new Error('clopperPearson needs whole counts with 0 ≤ count ≤ n and n ≥ 1');
	}
	if (!(confidence > 0 && confidence < 1)) {
		throw new Error(`clopperPearson needs 0 < confidence < 1, not ${confidence}`);
	}
}

/**
 * One-sided upper limit: the largest proportion π with P(X ≤ count | n, π) ≥ 1 − γ, i.e.
 * π_U = B⁻¹(γ; count + 1, n − count), and 1 when count = n. Cost O(1) (one beta quantile).
 * @example clopperPearsonUpper(5, 200, 0.95) // 0.0518 (RILEM TC 230-PSC worked example)
 */
export function clopperPearsonUpper(count: number, n: number, confidence = 0.95): number {
	checkCounts(count, n, confidence);
	return count === n ? 1 : jStat.beta.inv(confidence, count + 1, n - count);
}

/**
 * One-sided lower limit π_L = B⁻¹(1 − γ; count, n − count + 1), and 0 when count = 0.
 * @example clopperPearsonLower(5, 200, 0.95) // ≈ 0.0099
 */
export function clopperPearsonLower(count: number, n: number, confidence = 0.95): number {
	checkCounts(count, n, confidence);
	return count === 0 ? 0 : jStat.beta.inv(1 - confidence, count, n - count + 1);
}

/**
 * Two-sided interval at confidence γ: each limit one-sided at (1 + γ)/2.
 * @example clopperPearsonInterval(682, 925, 0.95) // { lower: 0.70767, upper: 0.76541 }
 */
export function clopperPearsonInterval(
	count: number,
	n: number,
	confidence = 0.95
): { lower: number; upper: number } {
	const oneSided = (1 + confidence) / 2;
	return {
		lower: clopperPearsonLower(count, n, oneSided),
		upper: clopperPearsonUpper(count, n, oneSided)
	};
}
