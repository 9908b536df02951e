/**
 * "Two populations?" on a population detail: when neither single model fits, a two-component
 * normal mixture (engine: fitNormalMixtureCounted, EM weighted by counts) and the members that
 * carry its low component, each from its own counts.
 */
import { mm, percent } from '$lib/format';
import {
	fitNormalMixtureCounted,
	lowComponentShareCounted,
	type NormalMixture,
	type PopulationAssessment
} from '$lib/analysis';
import type { GatheredGroup } from './groups';

/** Seed of the mixture's random starts: fixed, so the same readings give the same figures. */
export const MIXTURE_SEED = 1;

export interface PopulationMixture {
	mixture: Omit<NormalMixture, 'trace'>;
	/** Each member's share of readings the mixture gives to its low component. */
	members: { label: string; lowShare: number }[];
	/** Plain words for the verdict's reasons. */
	sentence: string;
}

function mixtureSentence(m: Omit<NormalMixture, 'trace'>, carriers: { label: string }[]): string {
	const [low, high] = m.components;
	const fit =
		`A mixture of two normal populations (EM, seed ${m.seed}, ${m.starts} starts, ` +
		`${m.converged ? `converged in ${m.iterations} iterations` : `not converged after ${m.iterations} iterations`}) ` +
		`gives ${percent(low.share, 0)} around ${mm(low.meanMm)} (SD ${mm(low.sdMm)}) and ` +
		`${percent(high.share, 0)} around ${mm(high.meanMm)} (SD ${mm(high.sdMm)}); ` +
		`BIC ${m.bicTwoComponents.toFixed(0)} against ${m.bicOneComponent.toFixed(0)} for one normal` +
		(m.twoComponentsPreferred
			? ', so two populations are the better account.'
			: ', not clearly better.');
	if (!m.twoComponentsPreferred) return fit;
	const who =
		carriers.length === 0
			? ' No member carries the low component for most of its readings: the low readings are spread over the members.'
			: ` Most readings of ${carriers.map((c) => c.label).join(', ')} belong to the low component.`;
	return fit + who;
}

/**
 * When neither model fits, a two-component normal mixture (engine: fitNormalMixture, seeded)
 * and the members that carry its low component (more than half their readings). EM over the
 * distinct covers, weighted by their counts. null when a model fits or the readings are too few.
 */
export function populationMixture(
	group: GatheredGroup,
	assessment: PopulationAssessment | null
): PopulationMixture | null {
	const models = assessment?.models;
	if (!models?.normal.rejected || models.lognormal?.rejected === false) return null;
	if (group.sample.n < 10) return null;
	// The trace of every iteration's lnL is for tests; the page needs the outcome.
	const { trace: _trace, ...mixture } = fitNormalMixtureCounted(group.sample, {
		seed: MIXTURE_SEED
	});
	const members = group.members.flatMap((m) => {
		const own = group.samplesByMember.get(m.id);
		return own ? [{ label: m.label, lowShare: lowComponentShareCounted(mixture, own) }] : [];
	});
	const carriers = members.filter((m) => m.lowShare > 0.5);
	return { mixture, members, sentence: mixtureSentence(mixture, carriers) };
}
