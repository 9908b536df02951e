import { enRequirement, type ExposureClass } from '../src/lib/analysis';
import { SeededRandom } from './random';
import type { CoverPlan, DemoMemberPlan } from './scenario';

export interface GeneratedReading {
	xMm: number;
	yMm: number;
	coverMm: number;
	barDiameterMm: number;
	barSpacingMm: number;
	barDirection: string;
}

export interface GeneratedHole {
	label: string;
	xMm: number;
	yMm: number;
	meterReadingMm: number;
	measuredCoverMm: number;
}

/** The member's specified cover by EN 1992-1-1 §4.4.1 (structural class S4, Δc_dev 10 mm). */
export function specifiedCover(member: DemoMemberPlan) {
	const requirement = enRequirement({
		exposureClass: member.exposureClass as ExposureClass,
		structuralClass: 'S4',
		barDiameterMm: member.barDiameterMm
	});
	return {
		cMinMm: requirement.cMinMm,
		cNomMm: requirement.cNomMm,
		deltaCDevMm: requirement.deltaCDevMm
	};
}

const round1 = (value: number) => Math.round(value * 10) / 10;

/** The cover at a point: the member's distribution plus, inside a low patch, a smooth dip. */
function coverAt(plan: CoverPlan, member: DemoMemberPlan, x: number, y: number, rng: SeededRandom) {
	const base =
		plan.model === 'normal'
			? rng.normal(plan.meanMm, plan.sdMm)
			: rng.lognormal(plan.meanMm, plan.sdMm);
	if (!plan.lowPatch) return base;
	const { xFraction, yFraction, radiusFraction, dropMm } = plan.lowPatch;
	const dx = x / member.gridWidthMm - xFraction;
	const dy = y / member.gridHeightMm - yFraction;
	const distance2 = (dx * dx + dy * dy) / (radiusFraction * radiusFraction);
	return base - dropMm * Math.exp(-distance2);
}

/**
 * Readings as a cover meter logs them: scan lines across the member, one reading where each bar
 * is crossed (bar positions at the specified spacing with a few mm of fixing scatter).
 */
export function generateReadings(member: DemoMemberPlan, rng: SeededRandom): GeneratedReading[] {
	const readings: GeneratedReading[] = [];
	for (
		let y = member.scanLineSpacingMm / 2;
		y < member.gridHeightMm;
		y += member.scanLineSpacingMm
	) {
		for (let x = member.barSpacingMm / 2; x < member.gridWidthMm; x += member.barSpacingMm) {
			const xMm = round1(x + rng.normal(0, 6));
			const cover = coverAt(member.cover, member, xMm, y, rng);
			readings.push({
				xMm,
				yMm: round1(y),
				coverMm: round1(Math.min(Math.max(cover, 4), 150)),
				// Meter diameter estimates scatter about ±1 mm round the real bar (common practice).
				barDiameterMm: round1(member.barDiameterMm + rng.normal(0, 0.6)),
				barSpacingMm: round1(member.barSpacingMm + rng.normal(0, 5)),
				barDirection: 'x'
			});
		}
	}
	return readings;
}

/**
 * Check holes at some of the readings: the cover found in the hole relates to the meter's
 * reading as measured = 1.6 + 0.97·reading ± 1 mm (a small invented meter bias).
 */
export function generateHoles(
	readings: GeneratedReading[],
	count: number,
	rng: SeededRandom
): GeneratedHole[] {
	const holes: GeneratedHole[] = [];
	for (let i = 0; i < count; i++) {
		const reading = readings[rng.integer(0, readings.length - 1)];
		holes.push({
			label: `H${i + 1}`,
			xMm: reading.xMm,
			yMm: reading.yMm,
			meterReadingMm: reading.coverMm,
			measuredCoverMm: round1(1.6 + 0.97 * reading.coverMm + rng.normal(0, 1))
		});
	}
	return holes;
}
