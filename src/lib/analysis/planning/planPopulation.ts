/**
 * A survey plan for one population (member type × exposure class): the readings each criterion
 * needs, the governing one, the operating characteristic at that n, and the split over members.
 */
import type { CharacteristicMethod } from '../characteristicCover';
import type { ModelChoice } from '../assessOptions';
import { aciCoverToleranceMm } from '../requirements/aci';
import { allowedFractionOf, type CoverRequirement } from '../requirements/requirement';
import { RULE_SETS, type RuleSetName } from '../rules/ruleSets';
import type { RuleId } from '../rules/ruleTypes';
import { EXACT_OC, ruleOc, type OcMethod, type RuleOcSettings } from './operatingCharacteristic';
import { characteristicPenaltyMm, readingsForPenalty } from './penalty';
import { readingsForRule, type Discrimination } from './requiredReadings';
import { simulateRuleSetOc } from './simulate';

export interface PlanSettings extends Discrimination {
	ruleSet: RuleSetName;
	method: CharacteristicMethod;
	model: ModelChoice;
	fractileP: number;
	confidence: number;
	minSampleSize: number;
	/** Largest finite-sample penalty on the characteristic cover accepted, mm. */
	marginMm: number;
	seed: number;
	replicates: number;
}

export interface PopulationToPlan {
	memberType: string;
	exposureClass: string;
	/** Members planned to be read in this population. */
	memberCount: number;
	requirement: CoverRequirement;
	/** Expected standard deviation of cover, mm. */
	sdMm: number;
	/** Where sdMm comes from, in words (a previous survey, or the stated default). */
	sdBasis: string;
}

export interface Criterion {
	id: 'penalty' | 'minimum-sample' | RuleId;
	label: string;
	n: number | null;
	note: string | null;
}

export interface OcCurve {
	id: RuleId | 'rule-set';
	label: string;
	method: OcMethod;
	points: { p: number; accept: number }[];
}

export interface PopulationPlan {
	memberType: string;
	exposureClass: string;
	sdMm: number;
	sdBasis: string;
	cMinMm: number;
	criteria: Criterion[];
	/** The n the plan takes: the largest n of the criteria that have one. */
	governing: { n: number; criterion: Criterion['id'] };
	penaltyAtNMm: number;
	memberCount: number;
	readingsPerMember: number;
	totalReadings: number;
	curves: OcCurve[];
	/** The rule set's simulated acceptance at p0 and p1 for the planned total. */
	atP0: number;
	atP1: number;
}

const RULE_LABELS: Record<RuleId, string> = {
	'every-reading-min': 'Every reading at least c_min',
	'characteristic-min': 'Characteristic cover at least c_min',
	'fraction-below-min': 'Share below c_min within the allowance',
	'aci-tolerance': 'Every reading within the ACI 117 tolerance',
	'excess-cover': 'Cover not above c_nom + Δplus'
};

export function ocSettings(settings: PlanSettings, population: PopulationToPlan): RuleOcSettings {
	const r = population.requirement;
	const tolerance = r.memberDepthMm
		? aciCoverToleranceMm(r.cNomMm, r.memberDepthMm)
		: r.deltaCDevMm;
	return {
		method: settings.method,
		fractileP: settings.fractileP,
		confidence: settings.confidence,
		minSampleSize: settings.minSampleSize,
		allowedFractionBelow: allowedFractionOf(r),
		aciLimitAboveCMinMm: r.cNomMm - tolerance - r.cMinMm,
		sdMm: population.sdMm
	};
}

/** Shares below c_min at which curves are drawn: 0 to about twice p1. */
export function ocGrid(p1: number, points: number): number[] {
	const top = Math.min(0.5, Math.max(0.1, 2 * p1));
	return Array.from({ length: points }, (_, i) => (top * (i + 1)) / points);
}

function criteriaOf(settings: PlanSettings, population: PopulationToPlan, s: RuleOcSettings) {
	const rules = (RULE_SETS[settings.ruleSet] as readonly RuleId[]).filter((id) => id in EXACT_OC);
	const usesCharacteristic = rules.includes('characteristic-min');
	const statistical = rules.some(
		(id) => id === 'characteristic-min' || id === 'fraction-below-min'
	);
	const criteria: Criterion[] = [];
	if (usesCharacteristic) {
		const n = readingsForPenalty(
			settings.marginMm,
			population.sdMm,
			settings.method,
			settings.fractileP,
			settings.confidence
		);
		criteria.push({
			id: 'penalty',
			label: `Penalty on the characteristic cover at most ${settings.marginMm} mm`,
			n,
			note: n === null ? 'More readings than any plan here takes.' : null
		});
	}
	if (statistical) {
		criteria.push({
			id: 'minimum-sample',
			label: 'Fewest readings the statistical rules judge',
			n: settings.minSampleSize,
			note: null
		});
	}
	for (const id of rules) {
		const { n, note } = readingsForRule(id, settings, s);
		criteria.push({ id, label: `${RULE_LABELS[id]}: accept p0, reject p1`, n, note });
	}
	return criteria;
}

/**
 * Plan one population. Exact curves for each rule with one (binomial for the attribute rules,
 * noncentral t for the characteristic rule, normal model), and the whole rule set by seeded
 * simulation of the population assessment. Cost: dominated by the simulation,
 * replicates × 13 assessments of n readings.
 */
export function planPopulation(
	settings: PlanSettings,
	population: PopulationToPlan
): PopulationPlan {
	if (!(population.memberCount >= 1)) throw new Error('planPopulation needs at least 1 member');
	const s = ocSettings(settings, population);
	const criteria = criteriaOf(settings, population, s);
	const withN = criteria.filter((c) => c.n !== null);
	const top = withN.reduce<Criterion | null>((a, c) => (a === null || c.n! > a.n! ? c : a), null);
	const governing = top
		? { n: top.n!, criterion: top.id }
		: { n: 2, criterion: 'minimum-sample' as const };
	const perMember = Math.ceil(governing.n / population.memberCount);
	const total = perMember * population.memberCount;
	const exactGrid = [0, ...ocGrid(settings.p1, 40)];
	const curves: OcCurve[] = [];
	for (const c of criteria) {
		if (c.id === 'penalty' || c.id === 'minimum-sample') continue;
		const points = exactGrid.map((p) => ({ p, accept: ruleOc(c.id as RuleId, total, p, s) }));
		if (points.some((pt) => pt.accept === null)) continue;
		curves.push({
			id: c.id,
			label: RULE_LABELS[c.id],
			method: EXACT_OC[c.id]!,
			points: points as { p: number; accept: number }[]
		});
	}
	const simGrid = [settings.p0, ...ocGrid(settings.p1, 12), settings.p1].sort((a, b) => a - b);
	const options = {
		ruleSet: settings.ruleSet,
		characteristicMethod: settings.method,
		model: settings.model,
		fractileP: settings.fractileP,
		confidence: settings.confidence,
		minSampleSize: settings.minSampleSize
	};
	const simulated = simulateRuleSetOc(
		total,
		simGrid,
		population.sdMm,
		population.requirement,
		options,
		settings.replicates,
		settings.seed
	);
	curves.push({
		id: 'rule-set',
		label: `Whole rule set (${settings.ruleSet})`,
		method: 'simulation',
		points: simulated.map(({ p, accept }) => ({ p, accept }))
	});
	const at = (p: number) => simulated.find((pt) => pt.p === p)!.accept;
	return {
		memberType: population.memberType,
		exposureClass: population.exposureClass,
		sdMm: population.sdMm,
		sdBasis: population.sdBasis,
		cMinMm: population.requirement.cMinMm,
		criteria,
		governing,
		penaltyAtNMm: characteristicPenaltyMm(
			total,
			population.sdMm,
			settings.method,
			settings.fractileP,
			settings.confidence
		),
		memberCount: population.memberCount,
		readingsPerMember: perMember,
		totalReadings: total,
		curves,
		atP0: at(settings.p0),
		atP1: at(settings.p1)
	};
}
