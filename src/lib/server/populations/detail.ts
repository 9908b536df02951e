/**
 * The extras of a population detail: box-plot figures per member and the meter's verification
 * from the check holes of the members — every figure by the engine.
 */
import {
	compareMembers,
	fitNormalMixture,
	lowComponentShare,
	type NormalMixture,
	type PopulationAssessment,
	describeSorted,
	type MemberComparison,
	MIN_VERIFICATION_HOLES,
	percentileSorted,
	verifyMeter,
	type MeterVerification,
	type PercentileType
} from '$lib/analysis';
import { VerificationHole } from '$lib/server/db';
import type { GatheredGroup } from './groups';

export interface MemberBox {
	memberId: number;
	label: string;
	n: number;
	minMm: number;
	q1Mm: number;
	medianMm: number;
	q3Mm: number;
	maxMm: number;
	meanMm: number | null;
}

/**
 * Box-plot figures per member, each from that member's own sorted covers (the group's merged
 * array is ordered by cover, not by member, so it cannot be sliced per member).
 */
export function memberBoxes(group: GatheredGroup, type: PercentileType): MemberBox[] {
	const boxes: MemberBox[] = [];
	for (const member of group.members) {
		const sorted = group.coversByMember.get(member.id);
		const n = sorted?.length ?? 0;
		if (!sorted || n === 0) continue;
		boxes.push({
			memberId: member.id,
			label: member.label,
			n,
			minMm: sorted[0],
			q1Mm: percentileSorted(sorted, 0.25, type),
			medianMm: percentileSorted(sorted, 0.5, type),
			q3Mm: percentileSorted(sorted, 0.75, type),
			maxMm: sorted[n - 1],
			meanMm: n >= 2 ? describeSorted(sorted, type).meanMm : sorted[0]
		});
	}
	return boxes;
}

/**
 * Whether the members share one distribution and which stand apart (engine: compareMembers),
 * each member from its own covers. Detail only: O(N log N) for N readings, not paid by the
 * overview of every population. null with fewer than 2 members with readings.
 */
export function memberComparison(group: GatheredGroup): MemberComparison | null {
	const members = group.members.flatMap((m) => {
		const coversMm = group.coversByMember.get(m.id);
		return coversMm ? [{ label: m.label, coversMm }] : [];
	});
	return compareMembers(members, group.coversMm);
}

/** Seed of the mixture's random starts: fixed, so the same readings give the same figures. */
export const MIXTURE_SEED = 1;

export interface PopulationMixture {
	mixture: Omit<NormalMixture, 'trace'>;
	/** Each member's share of readings the mixture gives to its low component. */
	members: { label: string; lowShare: number }[];
	/** Plain words for the verdict's reasons. */
	sentence: string;
}

const mmText = (v: number) => `${v.toFixed(1)} mm`;

function mixtureSentence(m: Omit<NormalMixture, 'trace'>, carriers: { label: string }[]): string {
	const [low, high] = m.components;
	const fit =
		`A mixture of two normal populations (EM, seed ${m.seed}, ${m.starts} starts, ` +
		`${m.converged ? `converged in ${m.iterations} iterations` : `not converged after ${m.iterations} iterations`}) ` +
		`gives ${(100 * low.share).toFixed(0)} % around ${mmText(low.meanMm)} (SD ${mmText(low.sdMm)}) and ` +
		`${(100 * high.share).toFixed(0)} % around ${mmText(high.meanMm)} (SD ${mmText(high.sdMm)}); ` +
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
 * and the members that carry its low component (more than half their readings). Detail only:
 * EM on at most about 2000 classes. null when a model fits or the readings are too few.
 */
export function populationMixture(
	group: GatheredGroup,
	assessment: PopulationAssessment | null
): PopulationMixture | null {
	const models = assessment?.models;
	if (!models?.normal.rejected || models.lognormal?.rejected === false) return null;
	if (group.coversMm.length < 10) return null;
	// The trace of every iteration's lnL is for tests; the page needs the outcome.
	const { trace: _trace, ...mixture } = fitNormalMixture(group.coversMm, { seed: MIXTURE_SEED });
	const members = group.members.flatMap((m) => {
		const own = group.coversByMember.get(m.id);
		return own ? [{ label: m.label, lowShare: lowComponentShare(mixture, own) }] : [];
	});
	const carriers = members.filter((m) => m.lowShare > 0.5);
	return { mixture, members, sentence: mixtureSentence(mixture, carriers) };
}

export interface HoleRow {
	id: number;
	memberId: number;
	label: string;
	xMm: number | null;
	yMm: number | null;
	meterReadingMm: number;
	measuredCoverMm: number;
	method: string | null;
}

export interface MeterCheck {
	holes: HoleRow[];
	verification: MeterVerification | null;
	/** Why there is no verification, or why it is weak, in words; null when it is enough. */
	note: string | null;
}

/** The verification holes of these members and the meter's calibration from them. */
export async function meterCheck(memberIds: readonly number[]): Promise<MeterCheck> {
	const rows = await VerificationHole.findAll({
		where: { memberId: [...memberIds] },
		order: [['id', 'ASC']]
	});
	const holes: HoleRow[] = rows.map((h) => ({
		id: h.id,
		memberId: h.memberId,
		label: h.label,
		xMm: h.xMm,
		yMm: h.yMm,
		meterReadingMm: h.meterReadingMm,
		measuredCoverMm: h.measuredCoverMm,
		method: h.method
	}));
	if (holes.length < 3) {
		return {
			holes,
			verification: null,
			note: `${holes.length} verification hole${holes.length === 1 ? '' : 's'}: at least 3 are needed to check the meter.`
		};
	}
	const verification = verifyMeter(
		holes.map((h) => h.meterReadingMm),
		holes.map((h) => h.measuredCoverMm)
	);
	return {
		holes,
		verification,
		note: verification.enough
			? null
			: `Only ${holes.length} holes: the check is indicative; ${MIN_VERIFICATION_HOLES} or more are advised.`
	};
}
