/**
 * The demo's durability measurements, invented: chloride profiles on the car park's Level 2
 * decks and columns, carbonation tests on the office frame. Generated with a seeded generator
 * of their own (the readings' sequence is untouched) from plausible values, with the scatter a
 * laboratory's results show, and checked by the same zod schemas as the forms and the API.
 *
 * Chloride: the error-function solution of Fick's second law, C = Ci + (Cs − Ci)·erfc(x/(2√(D·t)))
 * (Crank 1975; the engine's own erfc), Cs 2–5 % by mass of binder and D ≈ 1e-12 m²/s at about
 * 25 years — our invented values, in the range the literature reports for de-iced car park decks
 * (from memory). The outermost increment is drawn lower than the model, as wetting and drying
 * near the surface leave it in practice (the reason fits leave it out).
 * Carbonation: x = k·√t with k 2–6 mm/√year by exposure (from memory; fib Bulletin 34 background).
 */
import { erfc, m2PerSToMm2PerYear } from '../src/lib/analysis';
import {
	carbonationTestSchema,
	chlorideProfileSchema,
	concreteAgeYears,
	type CarbonationTestInput,
	type ChlorideProfileInput
} from '../src/lib/intake/measurements';
import { SeededRandom } from './random';

export const MEASUREMENT_SEED = 20_250_617;

export interface MeasurementPlan<T> {
	memberLabel: string;
	input: T;
}

const round = (v: number, digits: number) => Number(v.toFixed(digits));

const DECK_INCREMENTS = [
	[0, 5],
	[5, 10],
	[10, 15],
	[15, 20],
	[20, 30],
	[30, 40],
	[40, 50]
];
const COLUMN_INCREMENTS = [
	[0, 5],
	[5, 10],
	[10, 20],
	[20, 30],
	[30, 40],
	[40, 50]
];

interface ProfileSite {
	memberLabel: string;
	label: string;
	xMm: number;
	yMm: number;
	surfacePercent: number;
	dM2PerS: number;
	increments: number[][];
	/** Reported by the laboratory by mass of concrete (converted with the values below). */
	byConcrete?: boolean;
}

// Bays 04 and 07 hold the patches of low cover (scenario.ts): profiles at their centres.
const PROFILE_SITES: ProfileSite[] = [
	{
		memberLabel: 'L2-BAY-01',
		label: 'CP-01',
		xMm: 3600,
		yMm: 2400,
		surfacePercent: 3.2,
		dM2PerS: 0.9e-12,
		increments: DECK_INCREMENTS
	},
	{
		memberLabel: 'L2-BAY-03',
		label: 'CP-02',
		xMm: 5200,
		yMm: 4100,
		surfacePercent: 2.6,
		dM2PerS: 0.8e-12,
		increments: DECK_INCREMENTS,
		byConcrete: true
	},
	{
		memberLabel: 'L2-BAY-04',
		label: 'CP-03',
		xMm: 2880,
		yMm: 4320,
		surfacePercent: 4.6,
		dM2PerS: 1.3e-12,
		increments: DECK_INCREMENTS
	},
	{
		memberLabel: 'L2-BAY-06',
		label: 'CP-04',
		xMm: 1800,
		yMm: 5600,
		surfacePercent: 3.8,
		dM2PerS: 1.0e-12,
		increments: DECK_INCREMENTS
	},
	{
		memberLabel: 'L2-BAY-07',
		label: 'CP-05',
		xMm: 2880,
		yMm: 4320,
		surfacePercent: 4.9,
		dM2PerS: 1.2e-12,
		increments: DECK_INCREMENTS,
		byConcrete: true
	},
	{
		memberLabel: 'L2-BAY-09',
		label: 'CP-06',
		xMm: 4400,
		yMm: 1500,
		surfacePercent: 2.2,
		dM2PerS: 0.7e-12,
		increments: DECK_INCREMENTS
	},
	{
		memberLabel: 'L2-COL-C1',
		label: 'CP-07',
		xMm: 900,
		yMm: 400,
		surfacePercent: 2.4,
		dM2PerS: 0.8e-12,
		increments: COLUMN_INCREMENTS
	},
	{
		memberLabel: 'L2-COL-C3',
		label: 'CP-08',
		xMm: 900,
		yMm: 600,
		surfacePercent: 2.0,
		dM2PerS: 0.6e-12,
		increments: COLUMN_INCREMENTS
	}
];

/** The conversion values the invented laboratory states for results by mass of concrete. */
const BINDER_KG_M3 = 360;
const DENSITY_KG_M3 = 2350;
const BACKGROUND_PERCENT = 0.06;

function profileOf(site: ProfileSite, ageYrs: number, testedOn: string, rng: SeededRandom) {
	const dMm2PerYear = m2PerSToMm2PerYear(site.dM2PerS);
	const spread = 2 * Math.sqrt(dMm2PerYear * ageYrs);
	const toBasis = site.byConcrete ? BINDER_KG_M3 / DENSITY_KG_M3 : 1;
	const increments = site.increments.map(([fromMm, toMm], i) => {
		const mid = (fromMm + toMm) / 2;
		const model =
			BACKGROUND_PERCENT + (site.surfacePercent - BACKGROUND_PERCENT) * erfc(mid / spread);
		const surfaceLoss = i === 0 ? rng.between(0.6, 0.85) : 1;
		const measured = Math.max(
			0.01,
			model * surfaceLoss * rng.normal(1, 0.06) + rng.normal(0, 0.02)
		);
		return { fromMm, toMm, chloridePercent: round(measured * toBasis, 3) };
	});
	return chlorideProfileSchema.parse({
		label: site.label,
		xMm: site.xMm,
		yMm: site.yMm,
		testedOn,
		basis: site.byConcrete ? 'concrete' : 'binder',
		binderContentKgM3: site.byConcrete ? BINDER_KG_M3 : null,
		concreteDensityKgM3: site.byConcrete ? DENSITY_KG_M3 : null,
		initialContentPercent: site.byConcrete ? null : BACKGROUND_PERCENT,
		method: site.byConcrete
			? 'Dust drilled in steps from a 25 mm bit; acid-soluble chloride by potentiometric titration, reported by mass of concrete'
			: 'Dust drilled in steps from a 25 mm bit; acid-soluble chloride by potentiometric titration',
		increments
	});
}

/** Six profiles on decks, two on columns, sampled the day after the Level 2 survey. */
export function carParkProfiles(
	yearOfConstruction: number,
	surveyDate: string
): MeasurementPlan<ChlorideProfileInput>[] {
	const rng = new SeededRandom(MEASUREMENT_SEED);
	const testedOn = nextDay(surveyDate);
	const age = concreteAgeYears(yearOfConstruction, testedOn);
	return PROFILE_SITES.map((site) => ({
		memberLabel: site.memberLabel,
		input: profileOf(site, age, testedOn, rng)
	}));
}

interface CarbonationSite {
	memberLabel: string;
	label: string;
	xMm: number;
	yMm: number;
	/** Carbonation coefficient k, mm/√year. */
	k: number;
	/** A test logged as the laboratory's min/mean/max only, without the single readings. */
	summaryOnly?: boolean;
}

// Beams XC3 (sheltered, fastest outdoors), columns XC4 (rain slows it), slabs XC1 (dry indoors).
const CARBONATION_SITES: CarbonationSite[] = [
	{ memberLabel: 'B-101', label: 'CT-01', xMm: 1500, yMm: 300, k: 4.2 },
	{ memberLabel: 'B-202', label: 'CT-02', xMm: 3000, yMm: 300, k: 3.8 },
	{ memberLabel: 'B-300', label: 'CT-03', xMm: 2200, yMm: 250, k: 4.6, summaryOnly: true },
	{ memberLabel: 'B-502', label: 'CT-04', xMm: 4500, yMm: 300, k: 4.9 },
	{ memberLabel: 'B-502', label: 'CT-05', xMm: 1200, yMm: 350, k: 4.4 },
	{ memberLabel: 'B-701', label: 'CT-06', xMm: 3600, yMm: 300, k: 3.5 },
	{ memberLabel: 'C-A2', label: 'CT-07', xMm: 800, yMm: 1500, k: 2.4 },
	{ memberLabel: 'C-C4', label: 'CT-08', xMm: 800, yMm: 2200, k: 2.9, summaryOnly: true },
	{ memberLabel: 'C-E6', label: 'CT-09', xMm: 800, yMm: 1200, k: 2.1 },
	{ memberLabel: 'S-L1', label: 'CT-10', xMm: 3000, yMm: 3000, k: 5.6 },
	{ memberLabel: 'S-L2', label: 'CT-11', xMm: 2000, yMm: 4500, k: 5.2 },
	{ memberLabel: 'S-L4', label: 'CT-12', xMm: 4200, yMm: 1800, k: 5.7 }
];

function carbonationOf(site: CarbonationSite, ageYrs: number, testedOn: string, rng: SeededRandom) {
	const front = site.k * Math.sqrt(ageYrs);
	const count = rng.integer(3, 5);
	const depthsMm = Array.from({ length: count }, () =>
		round(Math.max(1, rng.normal(front, 0.12 * front)), 1)
	);
	const method = 'Phenolphthalein sprayed on a freshly broken face of a 50 mm core';
	if (!site.summaryOnly)
		return carbonationTestSchema.parse({ ...site, testedOn, depthsMm, method });
	const mean = depthsMm.reduce((s, d) => s + d, 0) / count;
	return carbonationTestSchema.parse({
		...site,
		testedOn,
		depthsMm: [],
		depthMinMm: Math.min(...depthsMm),
		depthMeanMm: round(mean, 1),
		depthMaxMm: Math.max(...depthsMm),
		method: `${method}; the laboratory sheet gives only minimum, mean and maximum`
	});
}

/** A dozen carbonation tests across the office frame, taken on the survey's second day. */
export function officeCarbonationTests(
	yearOfConstruction: number,
	surveyDate: string
): MeasurementPlan<CarbonationTestInput>[] {
	const rng = new SeededRandom(MEASUREMENT_SEED + 1);
	const testedOn = nextDay(surveyDate);
	const age = concreteAgeYears(yearOfConstruction, testedOn);
	return CARBONATION_SITES.map((site) => ({
		memberLabel: site.memberLabel,
		input: carbonationOf(site, age, testedOn, rng)
	}));
}

function nextDay(date: string): string {
	return new Date(Date.parse(`${date}T00:00:00Z`) + 86_400_000).toISOString().slice(0, 10);
}
