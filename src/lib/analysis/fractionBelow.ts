/**
 * Fraction of the population below a limit (c_min or any value).
 */
import { fractionBelowUpperBound } from './characteristicFactors';
import { clopperPearsonInterval, clopperPearsonUpper } from './clopperPearson';
import { type FittedModel, modelShareBelow } from './fitModels';
import { countBelowSorted, requireReadings } from './readings';

export interface FractionBelow {
	limitMm: number;
	confidence: number;
	n: number;
	/** Readings strictly below the limit (a reading equal to the limit complies). */
	count: number;
	/** count/n. */
	empirical: number;
	/** Clopper–Pearson two-sided interval at γ. */
	interval: { lower: number; upper: number };
	/** Clopper–Pearson one-sided upper bound at γ. */
	upperBound: number;
	/** F(limit) under the fitted normal (for readings all equal: 1 if below the limit, else 0). */
	normal: number;
	/** F(limit) under the fitted lognormal; null if it was not fitted. */
	lognormal: number | null;
	/** Variables-method upper bound at γ, normal model. */
	variablesUpperBoundNormal: number;
	/** Variables-method upper bound at γ on ln x, lognormal model. */
	variablesUpperBoundLognormal: number | null;
}

/**
 * Fraction below a limit: empirical count/n with the exact Clopper–Pearson interval, fitted
 * normal and lognormal, and the variables-method upper bound (noncentral t).
 * Units: limit in mm, fractions dimensionless. Cost O(log n) + a few beta/noncentral t
 * evaluations. Needs 2 readings.
 * @example fractionBelow(sorted, 45, normalFit, lognormalFit, 0.95).upperBound // 0.0518 (viaduct)
 */
export function fractionBelow(
	sorted: Float64Array,
	limitMm: number,
	normal: FittedModel,
	lognormal: FittedModel | null,
	confidence = 0.95
): FractionBelow {
	requireReadings('fractionBelow', sorted.length, 2);
	return fractionBelowFromCounts(
		countBelowSorted(sorted, limitMm),
		sorted.length,
		limitMm,
		normal,
		lognormal,
		confidence
	);
}

/**
 * fractionBelow from the count below the limit and n (all it reads of the readings), shared
 * with the counted form (countedSample.ts).
 */
export function fractionBelowFromCounts(
	count: number,
	n: number,
	limitMm: number,
	normal: FittedModel,
	lognormal: FittedModel | null,
	confidence = 0.95
): FractionBelow {
	requireReadings('fractionBelow', n, 2);
	return {
		limitMm,
		confidence,
		n,
		count,
		empirical: count / n,
		interval: clopperPearsonInterval(count, n, confidence),
		upperBound: clopperPearsonUpper(count, n, confidence),
		normal: modelShareBelow(normal, limitMm),
		lognormal: lognormal ? modelShareBelow(lognormal, limitMm) : null,
		variablesUpperBoundNormal: fractionBelowUpperBound(
			normal.location,
			normal.scale,
			n,
			limitMm,
			confidence
		),
		variablesUpperBoundLognormal:
			lognormal && limitMm > 0
				? fractionBelowUpperBound(
						lognormal.location,
						lognormal.scale,
						n,
						Math.log(limitMm),
						confidence
					)
				: null
	};
}
