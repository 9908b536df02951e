import { percent } from '$lib/format';
/** An area in square metres, as the owner's pages and the report show it. */
export const area = (m2: number | null) => (m2 === null ? 'unknown' : `${m2.toFixed(0)} m²`);

/** What a projected share needs to be printed honestly (a ShareView of the risk view). */
export interface ShareLike {
	modelProbability: number;
	reliabilityIndex: number | null;
	method: string;
	lessThan: number | null;
	standardError: number | null;
	samples: number | null;
	band: { low: number; high: number } | null;
}

/** Smallest digits that show a small share at all (0.002 %, not 0.0 %). */
const fine = (share: number) => percent(share, share > 0 && share < 0.001 ? 3 : 1);

/**
 * A projected share with what it is known to within: a simulated share with no hit is below
 * the simulation's resolution and printed "< 1/N", never 0; a simulated one carries its
 * standard error; a share from measured fronts carries its bootstrap band.
 */
export function shareWords(s: ShareLike | null | undefined): string {
	if (!s) return '–';
	if (s.lessThan !== null)
		return `< 1/${(s.samples ?? Math.round(1 / s.lessThan)).toLocaleString('en-GB')} (${fine(s.lessThan)}; SE ${fine(s.standardError ?? s.lessThan)})`;
	if (s.method === 'monte-carlo' && s.standardError !== null)
		return `${fine(s.modelProbability)} ± ${fine(s.standardError)} (SE)`;
	if (s.band)
		return `${percent(s.modelProbability)} (band ${percent(s.band.low)}–${percent(s.band.high)})`;
	return fine(s.modelProbability);
}

/** β where it can be claimed; below a simulation's resolution it is not. */
export function betaWords(s: ShareLike): string {
	if (s.lessThan !== null) return 'not claimed';
	return s.reliabilityIndex === null ? '–' : s.reliabilityIndex.toFixed(2);
}

export const METHOD_WORDS: Record<string, string> = {
	'closed-form-normal': 'closed form',
	'closed-form-fixed-front': 'closed form',
	'monte-carlo': 'simulated',
	'measured-front': 'measured fronts'
};
