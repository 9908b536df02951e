/**
 * Risk of one population: the engine's depassivation assessment at the ages an owner asks
 * about and on a curve over time, turned into a level with its reason. Pure: no database.
 */
import {
	depassivationAssessment,
	FIB_TARGET_BETA_DEPASSIVATION,
	meetsTargetBeta,
	reliabilityIndex,
	type DepassivationAtAge,
	type FittedModel,
	type PopulationAssessment
} from '$lib/analysis';
import { riskLevel, type RiskLevel } from './levels';
import { measuredRisk, type MeasuredRisk, type MeasuredShare } from './measured';
import type { MeasuredRiskInput, PopulationMeasurements } from './measured';
import { toDurabilityModel } from './model';
import { SIMULATION, type ExposureParameters } from './parameters';

/** The fixed ages of the owner's questions (years of age of the structure). */
export const HEADLINE_AGES_YEARS = [10, 25, 50] as const;
/** Curve step (years); the first age missing the target is reported to this resolution. */
export const CURVE_STEP_YEARS = 5;

export interface RiskAtAge {
	years: number;
	empiricalShare: number;
	/** The projected share: the model's probability, or the share under the measured fronts. */
	modelProbability: number;
	reliabilityIndex: number | null;
	meetsTarget: boolean;
	method: DepassivationAtAge['method'] | 'measured-front';
	/** Simulated: samples, standard error, and 1/N when no sample depassivated ("< 1/N"). */
	samples?: number | null;
	standardError?: number | null;
	lessThan?: number | null;
	/** Measured fronts: the bootstrap band (5 % and 95 %). */
	band?: { low: number; high: number };
}

export interface PopulationRisk {
	populationId: string;
	label: string;
	memberType: string;
	exposureClass: string;
	n: number;
	memberCount: number;
	areaM2: number | null;
	cMinMm: number | null;
	shareBelowCMin: number | null;
	verdict: PopulationAssessment['verdict'] | null;
	model: ExposureParameters['kind'] | null;
	targetBeta: number;
	/** At 10, 25 and 50 years, then the survey age, then the design life (when a model applies). */
	atAges: (RiskAtAge & { label: string })[];
	atDesignLife: RiskAtAge | null;
	curve: RiskAtAge[];
	firstAgeMissingTarget: number | null;
	/** The projection from measured fronts, when the population has them; it replaces the assumed one. */
	measured?: MeasuredRisk | null;
	level: RiskLevel;
	reason: string;
}

export interface PopulationRiskInput {
	populationId: string;
	label: string;
	memberType: string;
	exposureClass: string;
	memberCount: number;
	areaM2: number | null;
	assessment: PopulationAssessment | null;
	sortedCoversMm: Float64Array;
	parameters: ExposureParameters | null;
	designLifeYears: number;
	ageAtSurveyYears: number | null;
	/** The asset's measurements for this population's type and exposure class. */
	measurements?: PopulationMeasurements;
	/** C_crit, stated Ci and seed for measured chloride fronts (from the parameters). */
	measuredSettings?: Pick<MeasuredRiskInput, 'critical' | 'statedInitialContent' | 'seed'>;
}

const slim = (a: DepassivationAtAge): RiskAtAge => ({
	years: a.years,
	empiricalShare: a.empiricalShare,
	modelProbability: a.modelProbability,
	reliabilityIndex: a.reliabilityIndex,
	meetsTarget: a.meetsTarget,
	method: a.method,
	samples: a.samples,
	standardError: a.standardError,
	lessThan: a.lessThan
});

/** A measured share as a point of the curve: β and the target from the share itself. */
const fromMeasured = (m: MeasuredShare): RiskAtAge => ({
	years: m.years,
	empiricalShare: m.share,
	modelProbability: m.share,
	reliabilityIndex: reliabilityIndex(m.share),
	meetsTarget: meetsTargetBeta(m.share),
	method: 'measured-front',
	band: { low: m.low, high: m.high }
});

/** The cover model the engine chose for the population's characteristic rule. */
export function coverModelOf(assessment: PopulationAssessment): FittedModel {
	const fit =
		assessment.chosenModel === 'lognormal' && assessment.models.lognormal
			? assessment.models.lognormal
			: assessment.models.normal;
	return { model: fit.model, location: fit.location, scale: fit.scale };
}

export function curveAges(designLifeYears: number): number[] {
	const last = Math.max(
		100,
		Math.ceil((designLifeYears + 20) / CURVE_STEP_YEARS) * CURVE_STEP_YEARS
	);
	const ages: number[] = [];
	for (let y = CURVE_STEP_YEARS; y <= last; y += CURVE_STEP_YEARS) ages.push(y);
	return ages;
}

function headlineLabels(ages: readonly number[]): string[] {
	return ages.map((y, i) =>
		i < HEADLINE_AGES_YEARS.length ? `${y} years` : `at the survey (${y} years)`
	);
}

function measuredProjections(measured: MeasuredRisk) {
	const headline = [...measured.atAges, ...(measured.now ? [measured.now] : [])];
	const labels = headlineLabels(headline.map((a) => a.years));
	return {
		atAges: headline.map((a, i) => ({ ...fromMeasured(a), label: labels[i] })),
		atDesignLife: fromMeasured(measured.atDesignLife),
		curve: measured.curve.map(fromMeasured),
		targetBeta: FIB_TARGET_BETA_DEPASSIVATION
	};
}

function measuredOf(input: PopulationRiskInput): MeasuredRisk | null {
	const kind = input.parameters?.kind;
	if (!kind || !input.measurements || !input.measuredSettings) return null;
	return measuredRisk({
		sortedCoversMm: input.sortedCoversMm,
		measurements: input.measurements,
		kind,
		designLifeYears: input.designLifeYears,
		ageAtSurveyYears: input.ageAtSurveyYears,
		headlineAges: HEADLINE_AGES_YEARS,
		curveAges: curveAges(input.designLifeYears),
		...input.measuredSettings
	});
}

function projections(
	input: PopulationRiskInput,
	assessment: PopulationAssessment,
	measured: MeasuredRisk | null
) {
	if (!input.parameters || input.sortedCoversMm.length === 0) return null;
	if (measured) return measuredProjections(measured);
	const ages = [
		...HEADLINE_AGES_YEARS,
		...(input.ageAtSurveyYears === null ? [] : [input.ageAtSurveyYears])
	];
	const options = { designLifeYears: input.designLifeYears, ...SIMULATION };
	const model = toDurabilityModel(input.parameters);
	const cover = coverModelOf(assessment);
	const headline = depassivationAssessment(input.sortedCoversMm, cover, model, {
		...options,
		years: ages
	});
	const curve = depassivationAssessment(input.sortedCoversMm, cover, model, {
		...options,
		years: curveAges(input.designLifeYears)
	});
	const labels = headlineLabels(ages);
	return {
		atAges: headline.atAges.map((a, i) => ({ ...slim(a), label: labels[i] })),
		atDesignLife: slim(headline.designLife),
		curve: curve.atAges.map(slim),
		targetBeta: headline.targetBeta
	};
}

/** The risk of one population. Cost: two engine calls (closed form, or seeded Monte Carlo). */
export function populationRisk(input: PopulationRiskInput): PopulationRisk {
	const a = input.assessment;
	const measured = a && input.sortedCoversMm.length > 0 ? measuredOf(input) : null;
	const projected = a ? projections(input, a, measured) : null;
	const now = projected && input.ageAtSurveyYears !== null ? projected.atAges.at(-1)! : null;
	const firstMiss = projected?.curve.find((p) => !p.meetsTarget)?.years ?? null;
	const judged = riskLevel({
		shareBelowCMin: a ? a.fractionBelowCMin.empirical : null,
		cMinMm: a ? a.requirement.cMinMm : null,
		verdict: a ? a.verdict : null,
		designLifeYears: input.designLifeYears,
		ageAtSurveyYears: input.ageAtSurveyYears,
		probabilityNow: now?.modelProbability ?? null,
		meetsTargetNow: now?.meetsTarget ?? null,
		probabilityAtDesignLife: projected?.atDesignLife.modelProbability ?? null,
		meetsTargetAtDesignLife: projected?.atDesignLife.meetsTarget ?? null,
		firstAgeMissingTarget: firstMiss
	});
	return {
		populationId: input.populationId,
		label: input.label,
		memberType: input.memberType,
		exposureClass: input.exposureClass,
		n: a ? a.description.n : input.sortedCoversMm.length,
		memberCount: input.memberCount,
		areaM2: input.areaM2,
		cMinMm: a ? a.requirement.cMinMm : null,
		shareBelowCMin: a ? a.fractionBelowCMin.empirical : null,
		verdict: a ? a.verdict : null,
		model: input.parameters?.kind ?? null,
		targetBeta: projected?.targetBeta ?? FIB_TARGET_BETA_DEPASSIVATION,
		atAges: projected?.atAges ?? [],
		atDesignLife: projected?.atDesignLife ?? null,
		curve: projected?.curve ?? [],
		firstAgeMissingTarget: firstMiss,
		measured,
		...judged
	};
}
