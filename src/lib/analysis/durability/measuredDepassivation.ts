/**
 * Depassivation of a cover population now, from measured fronts (carbonation tests or fitted
 * chloride profiles).
 *
 * Convention (the engine's c_min one): a reading is depassivated when its cover is strictly
 * less than the front depth. Where the population has several test locations or profiles,
 * every reading is taken as equally likely to sit under any of them, so the share is the mean
 * over locations of #(cover < front_j)/n.
 */
import { countBelowSorted, requireReadings } from '../readings';
import { checkAges, frontSources, shareBelowFronts } from './measuredFront';
import type { MeasuredFront } from './measuredFront';

export interface MeasuredDepassivationNow {
	ageYears: number;
	/** Share of readings with cover < front (mean over locations). */
	share: number;
	convention: 'cover < front';
	locations: { label?: string; frontDepthMm: number | null; share: number }[];
	/** Profiles refused by the fit and left out. */
	refusedProfiles: number;
}

/** Throw unless the covers are numbers ≥ 0 sorted ascending (as toSortedCovers gives). */
export function checkSorted(sortedCoversMm: Float64Array, name: string): void {
	requireReadings(name, sortedCoversMm.length, 1);
	for (let i = 0; i < sortedCoversMm.length; i++)
		if (
			!(sortedCoversMm[i] >= 0 && Number.isFinite(sortedCoversMm[i])) ||
			(i > 0 && sortedCoversMm[i] < sortedCoversMm[i - 1])
		)
			throw new Error(
				`${name}: cover ${i + 1} must be a number ≥ 0 mm, sorted ascending (toSortedCovers)`
			);
}

/**
 * Share depassivated at one age from the measured front, with each location's front depth
 * (null when C_crit ≤ Ci: every depth is past the threshold, share 1).
 * Units: covers mm (sorted, as toSortedCovers gives), age years. Cost O(n + m·log n).
 * @example measuredDepassivation(sorted, { kind: 'carbonation', rates }, 26).share
 */
export function measuredDepassivation(
	sortedCoversMm: Float64Array,
	front: MeasuredFront,
	ageYears: number
): MeasuredDepassivationNow {
	checkSorted(sortedCoversMm, 'measuredDepassivation');
	checkAges([ageYears]);
	const { sources, refused } = frontSources(front);
	const locations = sources.map((s) => {
		const one = shareBelowFronts(
			(d) => countBelowSorted(sortedCoversMm, d),
			sortedCoversMm.length,
			[s.coefficient],
			[s.exponent],
			ageYears
		);
		const depth =
			s.coefficient === Infinity ? null : s.coefficient * Math.pow(ageYears, s.exponent);
		return {
			...(s.label === undefined ? {} : { label: s.label }),
			frontDepthMm: depth,
			share: one
		};
	});
	return {
		ageYears,
		share: locations.reduce((sum, l) => sum + l.share, 0) / locations.length,
		convention: 'cover < front',
		locations,
		refusedProfiles: refused
	};
}
