/**
 * Share of a cover population depassivated at chosen ages, empirically and from the fitted cover
 * distribution combined with the durability model's own scatter.
 */
import { type FittedModel, modelQuantile } from '../fitModels';
import { normalCdf } from '../normalDistribution';
import { countAtOrBelowSorted, requireReadings } from '../readings';
import { carbonationTimeToDepassivationYears } from './carbonation';
import {
	type ChlorideModel,
	chlorideContentAt,
	chlorideCriticalDepthMm,
	chlorideTimeToDepassivationYears
} from './chloride';
import { mulberry32, normalSampler } from './prng';
import { FIB_TARGET_BETA_DEPASSIVATION, reliabilityIndex } from './reliability';

export type DurabilityModel =
	| {
			kind: 'carbonation';
			kMmPerSqrtYear: number;
			/** CoV of the depth k√t (model scatter). */ depthCov?: number;
	  }
	| {
			kind: 'chloride';
			chloride: ChlorideModel;
			dCov?: number;
			surfaceCov?: number;
			criticalCov?: number;
	  };

export interface DepassivationAtAge {
	years: number;
	/** Depth reached by the front at this age with the mean model (mm); null if never. */
	criticalDepthMm: number | null;
	/** Share of readings with cover ≤ the critical depth. */
	empiricalShare: number;
	/** P(depassivation) from the fitted cover model and the model scatter. */
	modelProbability: number;
	method: 'closed-form-normal' | 'monte-carlo';
	/** β = −Φ⁻¹(P); null when P is 0 or 1. */
	reliabilityIndex: number | null;
	meetsTarget: boolean;
}

export interface DepassivationOptions {
	years: readonly number[];
	designLifeYears?: number;
	targetBeta?: number;
	samples?: number;
	seed?: number;
}

/** Depth (mm) the mean front reaches at an age. */
function frontDepthMm(model: DurabilityModel, years: number): number | null {
	if (model.kind === 'carbonation') return model.kMmPerSqrtYear * Math.sqrt(years);
	return chlorideCriticalDepthMm(model.chloride, years);
}

/** Years to depassivation of each reading (null: never). Cost O(n). */
export function timesToDepassivationYears(
	coversMm: readonly number[] | Float64Array,
	model: DurabilityModel
): (number | null)[] {
	return Array.from(coversMm, (c) =>
		model.kind === 'carbonation'
			? carbonationTimeToDepassivationYears(c, model.kMmPerSqrtYear)
			: chlorideTimeToDepassivationYears(model.chloride, c)
	);
}

function lognormalFactor(uniformNormal: () => number, cov: number): number {
	const s2 = Math.log(1 + cov * cov);
	return Math.exp(-s2 / 2 + Math.sqrt(s2) * uniformNormal());
}

/** Seeded Monte Carlo: share of samples whose cover is reached at `years`. */
function monteCarloProbability(
	cover: FittedModel,
	model: DurabilityModel,
	years: number,
	options: DepassivationOptions
): number {
	const z = normalSampler(mulberry32(options.seed ?? 1));
	const samples = options.samples ?? 100_000;
	let hits = 0;
	for (let i = 0; i < samples; i++) {
		const coverMm = modelQuantile(cover, z());
		if (model.kind === 'carbonation') {
			const meanMm = model.kMmPerSqrtYear * Math.sqrt(years);
			if (meanMm * (1 + (model.depthCov ?? 0) * z()) >= coverMm) hits++;
			continue;
		}
		const c = model.chloride;
		const drawn: ChlorideModel = {
			...c,
			dRefMm2PerYear: c.dRefMm2PerYear * lognormalFactor(z, model.dCov ?? 0),
			surfaceContent: c.surfaceContent * (1 + (model.surfaceCov ?? 0) * z())
		};
		const critical = c.criticalContent * (1 + (model.criticalCov ?? 0) * z());
		if (chlorideContentAt(drawn, Math.max(0, coverMm), years) >= critical) hits++;
	}
	return hits / samples;
}

function atAge(
	sorted: Float64Array,
	cover: FittedModel,
	model: DurabilityModel,
	years: number,
	options: DepassivationOptions
): DepassivationAtAge {
	const depthMm = frontDepthMm(model, years);
	const empiricalShare =
		depthMm === null ? 0 : countAtOrBelowSorted(sorted, depthMm) / sorted.length;
	let modelProbability: number;
	let method: DepassivationAtAge['method'];
	if (model.kind === 'carbonation' && cover.model === 'normal' && depthMm !== null) {
		const sdDepth = (model.depthCov ?? 0) * depthMm;
		modelProbability = normalCdf((depthMm - cover.location) / Math.hypot(sdDepth, cover.scale));
		method = 'closed-form-normal';
	} else {
		modelProbability = monteCarloProbability(cover, model, years, options);
		method = 'monte-carlo';
	}
	const beta = reliabilityIndex(modelProbability);
	const target = options.targetBeta ?? FIB_TARGET_BETA_DEPASSIVATION;
	return {
		years,
		criticalDepthMm: depthMm,
		empiricalShare,
		modelProbability,
		method,
		reliabilityIndex: beta,
		meetsTarget: beta === null ? modelProbability <= 0 : beta >= target
	};
}

/**
 * Depassivation at each chosen age and at the design service life (default 50 years).
 * Empirical: share of readings with cover ≤ front depth. Model: closed form
 * P = Φ((μx − μc)/√(σx² + σc²)) when cover and carbonation depth are both normal, otherwise
 * seeded Monte Carlo (mulberry32, default 100 000 samples, seed 1). β against the fib target 1.3.
 * Cost O(log n) a age, plus the samples when simulated. Needs 1 reading.
 */
export function depassivationAssessment(
	sorted: Float64Array,
	cover: FittedModel,
	model: DurabilityModel,
	options: DepassivationOptions
): { atAges: DepassivationAtAge[]; designLife: DepassivationAtAge; targetBeta: number } {
	requireReadings('depassivationAssessment', sorted.length, 1);
	return {
		atAges: options.years.map((y) => atAge(sorted, cover, model, y, options)),
		designLife: atAge(sorted, cover, model, options.designLifeYears ?? 50, options),
		targetBeta: options.targetBeta ?? FIB_TARGET_BETA_DEPASSIVATION
	};
}
