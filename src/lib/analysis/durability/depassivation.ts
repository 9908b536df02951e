/**
 * Share of a cover population depassivated at chosen ages, empirically and from the fitted cover
 * distribution combined with the durability model's own scatter.
 *
 * Convention, the same as for c_min (a reading is below c_min when cover < c_min) and as the
 * measured fronts (measuredFront.ts): a bar is depassivated when its cover is strictly less
 * than the front depth; a cover equal to the front is still protected. For the continuous
 * models the boundary has probability 0; it decides only the empirical count and the simulation.
 */
import { type FittedModel, modelQuantile, modelShareBelow } from '../fitModels';
import { normalCdf, normalQuantile } from '../normalDistribution';
import { countBelowSorted, requireReadings } from '../readings';
import { carbonationDepthMm, carbonationTimeToDepassivationYears } from './carbonation';
import {
	type ChlorideModel,
	chlorideContentAt,
	checkChlorideModel,
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
	/** Share of readings with cover < the critical depth (the c_min convention). */
	empiricalShare: number;
	/** P(depassivation) from the fitted cover model and the model scatter (simulated: hits/N). */
	modelProbability: number;
	/**
	 * 'closed-form-normal': normal cover and normal carbonation depth, Φ((μx − μc)/√(σx² + σc²));
	 * 'closed-form-fixed-front': no model scatter, so P = F_cover(front depth) exactly;
	 * 'monte-carlo': seeded simulation.
	 */
	method: 'closed-form-normal' | 'closed-form-fixed-front' | 'monte-carlo';
	/** Samples simulated; null for a closed form. */
	samples: number | null;
	/** Standard error of a simulated probability, √(P(1 − P)/N) (at P = 1/N when no sample hit). */
	standardError: number | null;
	/**
	 * 1/N when no simulated sample depassivated: the probability is below the simulation's
	 * resolution and is reported as "< 1/N", not as 0. null otherwise.
	 */
	lessThan: number | null;
	/** β = −Φ⁻¹(P); null when P is 0 or 1, and when a simulation had no hit or only hits. */
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
	if (model.kind === 'carbonation') return carbonationDepthMm(model.kMmPerSqrtYear, years);
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

/** Seeded Monte Carlo: number of samples whose cover is reached at `years`. */
function monteCarloHits(
	cover: FittedModel,
	model: DurabilityModel,
	years: number,
	options: DepassivationOptions,
	samples: number
): number {
	const z = normalSampler(mulberry32(options.seed ?? 1));
	let hits = 0;
	for (let i = 0; i < samples; i++) {
		const coverMm = modelQuantile(cover, z());
		if (model.kind === 'carbonation') {
			const meanMm = model.kMmPerSqrtYear * Math.sqrt(years);
			if (meanMm * (1 + (model.depthCov ?? 0) * z()) > coverMm) hits++;
			continue;
		}
		const c = model.chloride;
		const drawn: ChlorideModel = {
			...c,
			dRefMm2PerYear: c.dRefMm2PerYear * lognormalFactor(z, model.dCov ?? 0),
			surfaceContent: c.surfaceContent * (1 + (model.surfaceCov ?? 0) * z())
		};
		const critical = c.criticalContent * (1 + (model.criticalCov ?? 0) * z());
		// A drawn surface content or D below 0 is outside the model: it stays at 0.
		drawn.surfaceContent = Math.max(0, drawn.surfaceContent);
		if (chlorideContentAt(drawn, Math.max(0, coverMm), years) > critical) hits++;
	}
	return hits;
}

/** True when the durability model has no scatter of its own (the front is a fixed depth). */
function fixedFront(model: DurabilityModel): boolean {
	if (model.kind === 'carbonation') return (model.depthCov ?? 0) === 0;
	return (model.dCov ?? 0) === 0 && (model.surfaceCov ?? 0) === 0 && (model.criticalCov ?? 0) === 0;
}

type Probability = Pick<
	DepassivationAtAge,
	'modelProbability' | 'method' | 'samples' | 'standardError' | 'lessThan'
>;

const closedForm = (p: number, method: Probability['method']): Probability => ({
	modelProbability: p,
	method,
	samples: null,
	standardError: null,
	lessThan: null
});

/** Closed form where one exists (normal–normal carbonation, or a fixed front), else simulated. */
function probabilityAt(
	cover: FittedModel,
	model: DurabilityModel,
	years: number,
	depthMm: number | null,
	options: DepassivationOptions
): Probability {
	if (fixedFront(model)) {
		// P(cover < front): the CDF of the cover model; for a cover with no spread a step that
		// leaves a cover equal to the front protected.
		const p = depthMm === null ? 0 : depthMm === Infinity ? 1 : modelShareBelow(cover, depthMm);
		return closedForm(p, 'closed-form-fixed-front');
	}
	if (model.kind === 'carbonation' && cover.model === 'normal' && depthMm !== null) {
		const sd = Math.hypot((model.depthCov ?? 0) * depthMm, cover.scale);
		const p = normalCdf((depthMm - cover.location) / sd);
		return closedForm(p, 'closed-form-normal');
	}
	const samples = options.samples ?? 100_000;
	const hits = monteCarloHits(cover, model, years, options, samples);
	const p = hits / samples;
	const atLeast = Math.max(p, 1 / samples);
	return {
		modelProbability: p,
		method: 'monte-carlo',
		samples,
		standardError: Math.sqrt((atLeast * (1 - atLeast)) / samples),
		lessThan: hits === 0 ? 1 / samples : null
	};
}

/** β, or null where it cannot be claimed (P of 0 or 1, or a simulation with no hit or all hits). */
function claimedBeta(probability: Probability): number | null {
	if (probability.method === 'monte-carlo' && probability.lessThan !== null) return null;
	if (probability.method === 'monte-carlo' && probability.modelProbability === 1) return null;
	return reliabilityIndex(probability.modelProbability);
}

/** Check the ages and options: finite, ages ≥ 0, whole positive samples, scatter ≥ 0. */
function checkOptions(model: DurabilityModel, options: DepassivationOptions): void {
	for (const years of [...options.years, options.designLifeYears ?? 50]) {
		if (!(years >= 0 && Number.isFinite(years)))
			throw new Error(`depassivation needs ages ≥ 0 years, not ${years}`);
	}
	const samples = options.samples ?? 100_000;
	if (!(Number.isInteger(samples) && samples >= 1))
		throw new Error(`depassivation needs a whole number of samples ≥ 1, not ${samples}`);
	const scatter =
		model.kind === 'carbonation'
			? [model.depthCov ?? 0]
			: [model.dCov ?? 0, model.surfaceCov ?? 0, model.criticalCov ?? 0];
	if (!scatter.every((cov) => cov >= 0 && Number.isFinite(cov)))
		throw new Error('depassivation needs every coefficient of variation to be ≥ 0');
}

function atAge(
	sorted: Float64Array,
	cover: FittedModel,
	model: DurabilityModel,
	years: number,
	options: DepassivationOptions
): DepassivationAtAge {
	const depthMm = frontDepthMm(model, years);
	const empiricalShare = depthMm === null ? 0 : countBelowSorted(sorted, depthMm) / sorted.length;
	const probability = probabilityAt(cover, model, years, depthMm, options);
	const beta = claimedBeta(probability);
	const target = options.targetBeta ?? FIB_TARGET_BETA_DEPASSIVATION;
	// With no simulated hit, P < 1/N: the target is met when β at 1/N already reaches it.
	const meetsTarget =
		probability.lessThan !== null
			? -normalQuantile(probability.lessThan) >= target
			: beta === null
				? probability.modelProbability <= 0
				: beta >= target;
	return {
		years,
		criticalDepthMm: depthMm,
		empiricalShare,
		...probability,
		reliabilityIndex: beta,
		meetsTarget
	};
}

/**
 * Depassivation at each chosen age and at the design service life (default 50 years).
 * Empirical: share of readings with cover < front depth (the c_min convention). Model: a closed form where one exists
 * — P = F_cover(front) when the model has no scatter of its own, P = Φ((μx − μc)/√(σx² + σc²))
 * when cover and carbonation depth are both normal — otherwise seeded Monte Carlo (mulberry32,
 * default 100 000 samples, seed 1) with its standard error, and "< 1/N" (lessThan, β not
 * claimed) when no sample depassivates. β against the fib target 1.3. Throws on a negative or
 * non-finite age, a bad model figure, or a negative CoV.
 * Cost O(log n) a age, plus the samples when simulated. Needs 1 reading.
 */
export function depassivationAssessment(
	sorted: Float64Array,
	cover: FittedModel,
	model: DurabilityModel,
	options: DepassivationOptions
): { atAges: DepassivationAtAge[]; designLife: DepassivationAtAge; targetBeta: number } {
	requireReadings('depassivationAssessment', sorted.length, 1);
	checkOptions(model, options);
	if (model.kind === 'chloride') checkChlorideModel(model.chloride);
	return {
		atAges: options.years.map((y) => atAge(sorted, cover, model, y, options)),
		designLife: atAge(sorted, cover, model, options.designLifeYears ?? 50, options),
		targetBeta: options.targetBeta ?? FIB_TARGET_BETA_DEPASSIVATION
	};
}
