/**
 * The extras of a population detail: box-plot figures per member and the meter's verification
 * from the check holes of the members — every figure by the engine.
 */
import {
	compareMembersCounted,
	momentsCounted,
	type MemberComparison,
	MIN_VERIFICATION_HOLES,
	percentileCounted,
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
 * Box-plot figures per member, each from that member's own counts (the group's merged counts
 * no longer say which member a cover belongs to).
 */
export function memberBoxes(group: GatheredGroup, type: PercentileType): MemberBox[] {
	const boxes: MemberBox[] = [];
	for (const member of group.members) {
		const sample = group.samplesByMember.get(member.id);
		if (!sample || sample.n === 0) continue;
		boxes.push({
			memberId: member.id,
			label: member.label,
			n: sample.n,
			minMm: sample.values[0],
			q1Mm: percentileCounted(sample, 0.25, type),
			medianMm: percentileCounted(sample, 0.5, type),
			q3Mm: percentileCounted(sample, 0.75, type),
			maxMm: sample.values[sample.values.length - 1],
			meanMm: momentsCounted(sample).mean
		});
	}
	return boxes;
}

/**
 * Whether the members share one distribution and which stand apart (engine:
 * compareMembersCounted), each member from its own counts. O(members × distinct covers).
 * null with fewer than 2 members with readings.
 */
export function memberComparison(group: GatheredGroup): MemberComparison | null {
	const members = group.members.flatMap((m) => {
		const sample = group.samplesByMember.get(m.id);
		return sample ? [{ label: m.label, sample }] : [];
	});
	return compareMembersCounted(members, group.sample);
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
