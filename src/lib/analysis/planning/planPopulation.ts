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
import { simulateRuleSetOc, type SimulatedPoint } from './simulate';

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

/** Readings drawn per simulated point at most: replicates × n is capped so one point stays short. */
export const SIMULATION_READINGS_PER_POINT = 100_000;

/** The plan without the simulation, and what the simulation is to do. */
export interface PlanDraft {
	plan: Omit<PopulationPlan, 'atP0' | 'atP1'>;
	simulation: { n: number; ps: number[]; replicates: number; seed: number };
}

function exactCurves(criteria: Criterion[], total: number, p1: number, s: RuleOcSettings) {
	const grid = [0, ...ocGrid(p1, 40)];
	const curves: OcCurve[] = [];
	for (const c of criteria) {
		if (c.id === 'penalty' || c.id === 'minimum-sample') continue;
		const points = grid.map((p) => ({ p, accept: ruleOc(c.id as RuleId, total, p, s) }));
		if (points.some((pt) => pt.accept === null)) continue;
		curves.push({
			id: c.id,
			label: RULE_LABELS[c.id],
			method: EXACT_OC[c.id]!,
			points: points as { p: number; accept: number }[]
		});
	}
	return curves;
}

/**
 * Everything of a plan but the simulated curve: the criteria and their n, the governing n, its
 * split over the members and the exact curves. Fast (bisections and exact CDFs).
 */
export function draftPlan(settings: PlanSettings, population: PopulationToPlan): PlanDraft {
	if (!(population.memberCount >= 1)) throw new Error('planPopulation needs at least 1 member');
	const s = ocSettings(settings, population);
	const criteria = criteriaOf(settings, population, s);
	const top = criteria.reduce<Criterion | null>(
		(a, c) => (c.n !== null && (a === null || c.n > a.n!) ? c : a),
		null
	);
	const governing = top
		? { n: top.n!, criterion: top.id }
		: { n: settings.minSampleSize, criterion: 'minimum-sample' as const };
	const perMember = Math.ceil(governing.n / population.memberCount);
	const total = perMember * population.memberCount;
	const replicates = Math.max(
		20,
		Math.min(settings.replicates, Math.floor(SIMULATION_READINGS_PER_POINT / total))
	);
	return {
		plan: {
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
			curves: exactCurves(criteria, total, settings.p1, s)
		},
		simulation: {
			n: total,
			ps: [settings.p0, ...ocGrid(settings.p1, 12), settings.p1].sort((a, b) => a - b),
			replicates,
			seed: settings.seed
		}
	};
}

/** One simulated point of a draft: point i draws from seed + i, so points can run apart. */
export function simulatePoint(
	settings: PlanSettings,
	population: PopulationToPlan,
	draft: PlanDraft,
	i: number
): SimulatedPoint {
	const { n, ps, replicates, seed } = draft.simulation;
	const options = {
		ruleSet: settings.ruleSet,
		characteristicMethod: settings.method,
		model: settings.model,
		fractileP: settings.fractileP,
		confidence: settings.confidence,
		minSampleSize: settings.minSampleSize
	};
	return simulateRuleSetOc(
		n,
		[ps[i]],
		population.sdMm,
		population.requirement,
		options,
		replicates,
		seed + i
	)[0];
}

/** The draft with its simulated rule-set curve. */
export function completePlan(
	settings: PlanSettings,
	draft: PlanDraft,
	simulated: SimulatedPoint[]
): PopulationPlan {
	const at = (p: number) => simulated.find((pt) => pt.p === p)!.accept;
	const curve: OcCurve = {
		id: 'rule-set',
		label: `Whole rule set (${settings.ruleSet}), ${draft.simulation.replicates} draws a point`,
		method: 'simulation',
		points: simulated.map(({ p, accept }) => ({ p, accept }))
	};
	return {
		...draft.plan,
		curves: [...draft.plan.curves, curve],
		atP0: at(settings.p0),
		atP1: at(settings.p1)
	};
}

/**
 * Plan one population. Exact curves for each rule with one (binomial for the attribute rules,
 * noncentral t for the characteristic rule, normal model), and the whole rule set by seeded
 * simulation of its verdict on normal draws. Cost: dominated by the simulation, 14 points of
 * up to SIMULATION_READINGS_PER_POINT readings (≈ 0.2 s a point). A server calls draftPlan and
 * simulatePoint itself to yield between points.
 * @example planPopulation(settings, { memberType: 'slab', exposureClass: 'XC3', memberCount: 6, requirement, sdMm: 8, sdBasis: 'stated default' }).governing.n
 */
export function planPopulation(
	settings: PlanSettings,
	population: PopulationToPlan
): PopulationPlan {
	const draft = draftPlan(settings, population);
	const simulated = draft.simulation.ps.map((_, i) =>
		simulatePoint(settings, population, draft, i)
	);
	return completePlan(settings, draft, simulated);
}
