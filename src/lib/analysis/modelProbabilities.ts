/**
 * Model probabilities of every sorted reading, computed once and shared by the goodness-of-fit
 * tests (one erfc a reading instead of three).
 */
import { erfc } from './normalDistribution';
import { type FittedModel, standardise } from './fitModels';

export interface ModelProbabilities {
	/** F(x(i)) under the model. */
	cdf: Float64Array;
	/** 1 − F(x(i)), computed directly so the upper tail keeps its precision. */
	survival: Float64Array;
}

/**
 * F(x(i)) and 1 − F(x(i)) for sorted readings under a fitted model. Cost O(n), one erfc each:
 * the smaller tail q = Φ(−|z|) is computed and the other side is 1 − q.
 * @example modelProbabilities(Float64Array.of(45), { model: 'normal', location: 45, scale: 5 })
 * // { cdf: [0.5], survival: [0.5] }
 */
export function modelProbabilities(sorted: Float64Array, fit: FittedModel): ModelProbabilities {
	const n = sorted.length;
	const cdf = new Float64Array(n);
	const survival = new Float64Array(n);
	for (let i = 0; i < n; i++) {
		const z = standardise(fit, sorted[i]);
		const smallTail = 0.5 * erfc(Math.abs(z) * Math.SQRT1_2);
		if (z < 0) {
			cdf[i] = smallTail;
			survival[i] = 1 - smallTail;
		} else {
			cdf[i] = 1 - smallTail;
			survival[i] = smallTail;
		}
	}
	return { cdf, survival };
}
