/**
 * Goodness of fit for readings grouped by the meter's resolution. A meter that logs whole
 * millimetres gives many ties, and Anderson–Darling, built for continuous data, then rejects
 * every model for the ties alone. Here the model's probability of each logged value's class
 * [v − h/2, v + h/2) is compared with the count of that value: Pearson's chi-square over
 * resolution-aware classes (K. Pearson 1900; classes merged until each expects at least 5
 * readings, W. G. Cochran, Ann. Math. Statist. 23 (1952) 315–345). Our own: no package has it.
 */
import jStat from 'jstat';
import { type FittedModel, modelCdf } from './fitModels';

/** Fewest expected readings a class may have (Cochran 1952). */
const MIN_EXPECTED = 5;
/** Parameters estimated from the data (μ and σ), taken off the degrees of freedom. */
const ESTIMATED_PARAMETERS = 2;

export interface GroupedFitResult {
	resolutionMm: number;
	/** Classes after merging. */
	classes: number;
	/** Pearson's X² = Σ(O − E)²/E. */
	statistic: number;
	/** classes − 1 − 2; null when fewer than 4 classes are left (too few distinct values). */
	degreesOfFreedom: number | null;
	/** Upper tail of χ²; null when it cannot be tested. */
	pValue: number | null;
}

/** Observed counts of each distinct value and the upper edge of its class, ascending. */
function valueCounts(sorted: Float64Array, halfStep: number) {
	const uppers: number[] = [];
	const counts: number[] = [];
	for (let i = 0; i < sorted.length;) {
		let j = i;
		while (j < sorted.length && sorted[j] === sorted[i]) j++;
		uppers.push(sorted[i] + halfStep);
		counts.push(j - i);
		i = j;
	}
	return { uppers, counts };
}

/**
 * Chi-square test of sorted readings logged at `resolutionMm` against a fitted model (scale > 0).
 * Classes: each logged value's interval, the first open below and the last open above,
 * neighbours merged until each expects ≥ 5. Degrees of freedom classes − 3 (μ, σ estimated;
 * from ungrouped moments the test is slightly liberal, Chernoff & Lehmann 1954 — the seeded
 * simulation in the tests bounds the effect). Cost O(n) plus one CDF a distinct value.
 * @example groupedChiSquare(sorted, fitNormal(sorted), 1).pValue // e.g. 0.41
 */
export function groupedChiSquare(
	sorted: Float64Array,
	fit: FittedModel,
	resolutionMm: number
): GroupedFitResult {
	const { uppers, counts } = valueCounts(sorted, resolutionMm / 2);
	return groupedChiSquareFromCounts(uppers, counts, sorted.length, fit, resolutionMm);
}

/**
 * groupedChiSquare from each distinct value's class upper edge and count, ascending (n = Σ
 * counts); shared with the counted form of a population.
 */
export function groupedChiSquareFromCounts(
	uppers: ArrayLike<number>,
	counts: ArrayLike<number>,
	n: number,
	fit: FittedModel,
	resolutionMm: number
): GroupedFitResult {
	let statistic = 0;
	let classes = 0;
	let observed = 0;
	let lowerCdf = 0;
	let pendingO = 0;
	let pendingE = 0;
	for (let v = 0; v < counts.length; v++) {
		const upperCdf = v === counts.length - 1 ? 1 : modelCdf(fit, uppers[v]);
		observed += counts[v];
		const expected = n * (upperCdf - lowerCdf);
		lowerCdf = upperCdf;
		pendingO += counts[v];
		pendingE += expected;
		const remaining = n * (1 - upperCdf);
		// Close the class when it expects enough and what is left does too (else the tail joins).
		if (pendingE >= MIN_EXPECTED && remaining >= MIN_EXPECTED) {
			statistic += ((pendingO - pendingE) * (pendingO - pendingE)) / pendingE;
			classes++;
			pendingO = 0;
			pendingE = 0;
		}
	}
	if (pendingE > 0 || pendingO > 0) {
		statistic += ((pendingO - pendingE) * (pendingO - pendingE)) / Math.max(pendingE, 1e-300);
		classes++;
	}
	const dof = classes - 1 - ESTIMATED_PARAMETERS;
	if (observed !== n || dof < 1) {
		return { resolutionMm, classes, statistic, degreesOfFreedom: null, pValue: null };
	}
	return {
		resolutionMm,
		classes,
		statistic,
		degreesOfFreedom: dof,
		pValue: 1 - jStat.chisquare.cdf(statistic, dof)
	};
}
