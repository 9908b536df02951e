/**
 * A member's own view: its readings on the x–y grid for a cover map, its holes and the meter's
 * verification from every hole of the member's survey (one meter per survey).
 */
import { Member, Reading, Survey } from '$lib/server/db';
import type { CoverMapGrid } from '$lib/populations/coverMap';
import { coverMapGrid } from './coverMapGrid';
import { meterCheck, type MeterCheck } from './detail';
import { groupRequirement, type GroupRequirement } from './requirement';

export interface MemberReading {
	id: number;
	xMm: number | null;
	yMm: number | null;
	coverMm: number;
	barDiameterMm: number | null;
	barDirection: string | null;
	/** The surveyor's note on the reading, as typed or imported. */
	note: string | null;
	flags: number;
}

export interface MemberView {
	member: {
		id: number;
		label: string;
		assetId: number;
		surveyId: number;
		surveyTitle: string;
		memberType: string;
		face: string;
		exposureClass: string;
		gridWidthMm: number | null;
		gridHeightMm: number | null;
	};
	requirement: GroupRequirement;
	/** The map, binned on the server: its size does not grow with the readings. */
	coverMap: CoverMapGrid;
	/** The first readings (by id) for the table; readingsTotal says how many there are. */
	readings: MemberReading[];
	readingsTotal: number;
	/** Holes of this member only. */
	memberHoles: MeterCheck['holes'];
	/** The meter's verification from all holes of the survey. */
	surveyMeter: MeterCheck;
}

/** Readings listed in the member's view; the rest are counted (the survey's export has all). */
export const MEMBER_READINGS_LISTED = 1000;

export async function memberView(member: Member): Promise<MemberView> {
	const [survey, readings, readingsTotal, coverMap, surveyMembers] = await Promise.all([
		Survey.findByPk(member.surveyId),
		Reading.findAll({
			attributes: ['id', 'xMm', 'yMm', 'coverMm', 'barDiameterMm', 'barDirection', 'note', 'flags'],
			where: { memberId: member.id },
			order: [['id', 'ASC']],
			limit: MEMBER_READINGS_LISTED,
			raw: true
		}),
		Reading.count({ where: { memberId: member.id } }),
		coverMapGrid(member),
		Member.findAll({ attributes: ['id'], where: { surveyId: member.surveyId }, raw: true })
	]);
	const surveyMeter = await meterCheck(surveyMembers.map((m) => m.id));
	return {
		member: {
			id: member.id,
			label: member.label,
			assetId: member.assetId,
			surveyId: member.surveyId,
			surveyTitle: survey?.title ?? '',
			memberType: member.memberType,
			face: member.face,
			exposureClass: member.exposureClass,
			gridWidthMm: member.gridWidthMm,
			gridHeightMm: member.gridHeightMm
		},
		requirement: groupRequirement([member]),
		coverMap,
		readings: readings as MemberReading[],
		readingsTotal,
		memberHoles: surveyMeter.holes.filter((h) => h.memberId === member.id),
		surveyMeter
	};
}
