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

/** Share of a reading's variance that is spatially correlated (the rest is fixing and meter scatter). */
const CORRELATED_SHARE = 0.7;
/** Cosine waves summed for the random field: enough for a near-Gaussian marginal. */
const FIELD_WAVES = 32;

/**
 * A seeded, stationary random field of unit variance with a Gaussian correlation of length
 * `lengthMm` (random Fourier features: Rahimi & Recht 2007, "Random features for large-scale
 * kernel machines"): wave numbers drawn from N(0, 1/L²), phases uniform. Cover on a real deck
 * drifts as chairs sag and screeds vary, so neighbouring readings are alike.
 */
export function correlatedField(
	rng: SeededRandom,
	lengthMm: number
): (x: number, y: number) => number {
	const waves = Array.from({ length: FIELD_WAVES }, () => ({
		kx: rng.normal(0, 1 / lengthMm),
		ky: rng.normal(0, 1 / lengthMm),
		phase: rng.between(0, 2 * Math.PI)
	}));
	const amplitude = Math.sqrt(2 / FIELD_WAVES);
	return (x, y) => {
		let sum = 0;
		for (const w of waves) sum += Math.cos(w.kx * x + w.ky * y + w.phase);
		return amplitude * sum;
	};
}

/** The member's correlation length: a fifth of its longer side, at least 300 mm (invented). */
export const correlationLengthMm = (member: DemoMemberPlan) =>
	Math.max(300, Math.max(member.gridWidthMm, member.gridHeightMm) / 5);

/**
 * The cover at a point: a standard normal z mixing the member's field with independent scatter
 * (so each reading keeps the planned normal or lognormal distribution), and inside a low patch
 * a smooth dip.
 */
function coverAt(plan: CoverPlan, member: DemoMemberPlan, x: number, y: number, z: number): number {
	const base =
		plan.model === 'normal' ? plan.meanMm + plan.sdMm * z : lognormalAt(plan.meanMm, plan.sdMm, z);
	if (!plan.lowPatch) return base;
	const { xFraction, yFraction, radiusFraction, dropMm } = plan.lowPatch;
	const dx = x / member.gridWidthMm - xFraction;
	const dy = y / member.gridHeightMm - yFraction;
	const distance2 = (dx * dx + dy * dy) / (radiusFraction * radiusFraction);
	return base - dropMm * Math.exp(-distance2);
}

/** Lognormal whose own mean and SD are given, at standard normal z. */
function lognormalAt(mean: number, sd: number, z: number): number {
	const sigma2 = Math.log(1 + (sd * sd) / (mean * mean));
	return Math.exp(Math.log(mean) - sigma2 / 2 + Math.sqrt(sigma2) * z);
}

/**
 * Readings as a cover meter logs them: scan lines across the member, one reading where each bar
 * is crossed (bar positions at the specified spacing with a few mm of fixing scatter), rounded
 * to the meter's resolution (0.1 mm unless the survey's meter logs whole millimetres).
 */
export function generateReadings(
	member: DemoMemberPlan,
	rng: SeededRandom,
	resolutionMm = 0.1
): GeneratedReading[] {
	const readings: GeneratedReading[] = [];
	const field = correlatedField(rng, correlationLengthMm(member));
	const toResolution = (v: number) =>
		Math.round(Math.round(v / resolutionMm) * resolutionMm * 10) / 10;
	for (
		let y = member.scanLineSpacingMm / 2;
		y < member.gridHeightMm;
		y += member.scanLineSpacingMm
	) {
		for (let x = member.barSpacingMm / 2; x < member.gridWidthMm; x += member.barSpacingMm) {
			const xMm = round1(x + rng.normal(0, 6));
			const z =
				Math.sqrt(CORRELATED_SHARE) * field(xMm, y) +
				Math.sqrt(1 - CORRELATED_SHARE) * rng.normal(0, 1);
			const cover = coverAt(member.cover, member, xMm, y, z);
			readings.push({
				xMm,
				yMm: round1(y),
				coverMm: toResolution(Math.min(Math.max(cover, 4), 150)),
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
