/**
 * Bar spacing, bar diameter estimates and bar positions from scans.
 */
import { max, mean, min, sampleStandardDeviation } from 'simple-statistics';
import { requireReadings } from './readings';
import type { CodeSystem } from './requirements/requirement';

/** EN 10080 / common European stock of rebar diameters (mm). */
export const EN_BAR_DIAMETERS_MM = [6, 8, 10, 12, 14, 16, 20, 25, 28, 32, 40] as const;
/** ASTM A615 Table 1 nominal diameters (in) of bar designations No. 3 … No. 18. */
export const ACI_BAR_DIAMETERS_IN: Record<number, number> = {
	3: 0.375,
	4: 0.5,
	5: 0.625,
	6: 0.75,
	7: 0.875,
	8: 1.0,
	9: 1.128,
	10: 1.27,
	11: 1.41,
	14: 1.693,
	18: 2.257
};

/** Standard sizes in mm for a code system ('project' uses the EN stock). */
export function standardBarDiametersMm(codeSystem: CodeSystem): number[] {
	if (codeSystem === 'ACI') return Object.values(ACI_BAR_DIAMETERS_IN).map((d) => d * 25.4);
	return [...EN_BAR_DIAMETERS_MM];
}

/**
 * Round a meter's diameter estimate to the nearest standard bar (mm).
 * @example nearestStandardBarMm(19.3, 'EN') // 20
 */
export function nearestStandardBarMm(estimateMm: number, codeSystem: CodeSystem): number {
	let best = NaN;
	for (const d of standardBarDiametersMm(codeSystem)) {
		if (Number.isNaN(best) || Math.abs(d - estimateMm) < Math.abs(best - estimateMm)) best = d;
	}
	return best;
}

/**
 * Share of diameter estimates whose nearest standard size is the specified size. Cost O(n).
 * @example shareMatchingDiameter([19.3, 20.7, 16.2], 20, 'EN') // 0.667
 */
export function shareMatchingDiameter(
	estimatesMm: readonly number[],
	specifiedMm: number,
	codeSystem: CodeSystem
): number {
	requireReadings('shareMatchingDiameter', estimatesMm.length, 1);
	const specified = nearestStandardBarMm(specifiedMm, codeSystem);
	const hits = estimatesMm.filter((e) => nearestStandardBarMm(e, codeSystem) === specified).length;
	return hits / estimatesMm.length;
}

export interface SpacingSummary {
	n: number;
	meanMm: number;
	sdMm: number;
	minMm: number;
	maxMm: number;
	/** Share of spacings within specified ± tolerance. */
	shareWithinTolerance: number;
}

/**
 * Statistics of bar spacings (mm) against specified spacing ± tolerance. Needs 2 spacings.
 * @example spacingSummary([148, 152, 150], 150, 10).shareWithinTolerance // 1
 */
export function spacingSummary(
	spacingsMm: readonly number[],
	specifiedMm: number,
	toleranceMm: number
): SpacingSummary {
	requireReadings('spacingSummary', spacingsMm.length, 2);
	const within = spacingsMm.filter((s) => Math.abs(s - specifiedMm) <= toleranceMm).length;
	return {
		n: spacingsMm.length,
		meanMm: mean([...spacingsMm]),
		sdMm: sampleStandardDeviation([...spacingsMm]),
		// Loops, not Math.min(...): a spread of ~120,000 values overflows the call stack.
		minMm: min(spacingsMm as number[]),
		maxMm: max(spacingsMm as number[]),
		shareWithinTolerance: within / spacingsMm.length
	};
}

/** Spacings between successive bar positions along a line (mm), positions sorted first. */
export function spacingsFromPositions(positionsMm: readonly number[]): number[] {
	const sorted = Float64Array.from(positionsMm).sort();
	return Array.from(sorted.subarray(1), (p, i) => p - sorted[i]);
}

/**
 * Bar position along a scan: where the cover reading is smallest (common practice — the meter
 * reads least directly over the bar). Returns the position (mm) of the first minimum.
 * @example barPositionFromScan([0, 10, 20], [45, 38, 44]) // 10
 */
export function barPositionFromScan(
	positionsMm: readonly number[],
	readingsMm: readonly number[]
): number {
	requireReadings('barPositionFromScan', readingsMm.length, 1);
	if (positionsMm.length !== readingsMm.length)
		throw new Error('barPositionFromScan needs one position per reading');
	let best = 0;
	for (let i = 1; i < readingsMm.length; i++) if (readingsMm[i] < readingsMm[best]) best = i;
	return positionsMm[best];
}
