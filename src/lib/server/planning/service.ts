/**
 * Survey plans: how many readings each planned population needs, saved per survey with the
 * engine's answer, and the planned count of each member against what was measured.
 */
import { setImmediate } from 'node:timers/promises';
import {
	completePlan,
	draftPlan,
	ENGINE_VERSION,
	projectRequirement,
	simulatePoint,
	type PlanSettings,
	type PopulationPlan,
	type PopulationToPlan,
	type SimulatedPoint
} from '$lib/analysis';
import {
	DEFAULT_COVER_SD_MM,
	type PlannedPopulationInput,
	type SurveyPlanInput
} from '$lib/intake/plan';
import { recordAudit } from '../audit';
import { Member, MemberCoverSet, SurveyPlan, type Survey } from '../db/models';
import type { Actor } from '../policy';
import { scopedSurvey } from '../access';
import { assertSurveyEditable, assertSurveyEditableLocked } from '../intake/frozen';
import { earlierSpread } from './history';

const keyOf = (memberType: string, exposureClass: string) =>
	`${memberType}|${exposureClass.toUpperCase()}`;

/** The expected SD of a population and, in words, where it comes from. */
async function spreadFor(survey: Survey, p: PlannedPopulationInput) {
	if (p.sdMm !== null) return { sdMm: p.sdMm, sdBasis: 'entered by the engineer (assumed)' };
	const earlier = await earlierSpread(survey.assetId, survey.id, p.memberType, p.exposureClass);
	if (earlier) {
		return {
			sdMm: earlier.sdMm,
			sdBasis: `measured: sample SD of ${earlier.n} readings in survey "${earlier.surveyTitle}" (${earlier.surveyDate})`
		};
	}
	return {
		sdMm: DEFAULT_COVER_SD_MM,
		sdBasis: `assumed: the stated default of ${DEFAULT_COVER_SD_MM} mm (no earlier readings of this population on the asset)`
	};
}

async function toPlan(survey: Survey, p: PlannedPopulationInput): Promise<PopulationToPlan> {
	const requirement = projectRequirement(p.cNomMm, p.cNomMm - p.cMinMm, {
		deltaPlusMm: p.deltaPlusMm
	});
	return {
		memberType: p.memberType,
		exposureClass: p.exposureClass,
		memberCount: p.memberCount,
		requirement,
		...(await spreadFor(survey, p))
	};
}

/**
 * Runs the engine for each population, yielding to the event loop between simulated points
 * (each at most ≈ 0.2 s) so a plan never holds the server for its whole computation.
 */
async function computePlan(settings: PlanSettings, populations: PopulationToPlan[]) {
	const plans: PopulationPlan[] = [];
	for (const population of populations) {
		const draft = draftPlan(settings, population);
		const simulated: SimulatedPoint[] = [];
		for (let i = 0; i < draft.simulation.ps.length; i++) {
			await setImmediate();
			simulated.push(simulatePoint(settings, population, draft, i));
		}
		plans.push(completePlan(settings, draft, simulated));
	}
	return plans;
}

export interface MemberPlanRow {
	memberId: number;
	label: string;
	memberType: string;
	exposureClass: string;
	/** Readings the plan asks of this member; null when its population is not planned. */
	planned: number | null;
	measured: number;
}

/**
 * Each member of the survey with the readings its population's plan asks of it and the readings
 * it has, for a running count against the plan. Members whose population is not planned have
 * planned = null. No plan: every planned is null.
 */
export async function plannedReadingsByMember(surveyId: number): Promise<MemberPlanRow[]> {
	const [plan, members] = await Promise.all([
		SurveyPlan.findOne({ where: { surveyId } }),
		Member.findAll({ where: { surveyId }, order: [['label', 'ASC']] })
	]);
	const sets = await MemberCoverSet.findAll({
		attributes: ['memberId', 'readingCount'],
		where: { memberId: members.map((m) => m.id) }
	});
	const counts = new Map(sets.map((s) => [s.memberId, s.readingCount]));
	const perMember = new Map(
		((plan?.result as PopulationPlan[] | undefined) ?? []).map((p) => [
			keyOf(p.memberType, p.exposureClass),
			p.readingsPerMember
		])
	);
	return members.map((m) => ({
		memberId: m.id,
		label: m.label,
		memberType: m.memberType,
		exposureClass: m.exposureClass,
		planned: perMember.get(keyOf(m.memberType, m.exposureClass)) ?? null,
		measured: counts.get(m.id) ?? 0
	}));
}

export interface SurveyPlanView {
	surveyId: number;
	settings: PlanSettings;
	populations: PlannedPopulationInput[];
	result: (PopulationPlan & { measuredReadings: number; measuredMembers: number })[];
	engineVersion: string;
	updatedAt: Date;
	members: MemberPlanRow[];
}

/** The survey's saved plan with what has been measured since, or null when none is saved. */
export async function surveyPlanOf(actor: Actor, surveyId: number): Promise<SurveyPlanView | null> {
	await scopedSurvey(actor, surveyId, 'read');
	const plan = await SurveyPlan.findOne({ where: { surveyId } });
	if (!plan) return null;
	const members = await plannedReadingsByMember(surveyId);
	const result = (plan.result as PopulationPlan[]).map((p) => {
		const own = members.filter(
			(m) => keyOf(m.memberType, m.exposureClass) === keyOf(p.memberType, p.exposureClass)
		);
		return {
			...p,
			measuredReadings: own.reduce((sum, m) => sum + m.measured, 0),
			measuredMembers: own.filter((m) => m.measured > 0).length
		};
	});
	return {
		surveyId,
		settings: plan.settings as PlanSettings,
		populations: plan.populations as PlannedPopulationInput[],
		result,
		engineVersion: plan.engineVersion,
		updatedAt: plan.updatedAt,
		members
	};
}

/**
 * A first plan for the form: one population per member type × exposure class among the survey's
 * members, with their count and the largest c_min (and its c_nom) specified among them.
 */
export async function proposedPopulations(
	actor: Actor,
	surveyId: number
): Promise<PlannedPopulationInput[]> {
	await scopedSurvey(actor, surveyId, 'read');
	const members = await Member.findAll({ where: { surveyId }, order: [['id', 'ASC']] });
	const groups = new Map<string, PlannedPopulationInput>();
	for (const m of members) {
		const key = keyOf(m.memberType, m.exposureClass);
		const g = groups.get(key);
		if (!g) {
			groups.set(key, {
				memberType: m.memberType,
				exposureClass: m.exposureClass,
				memberCount: 1,
				sdMm: null,
				cMinMm: m.cMinMm,
				cNomMm: m.cNomMm,
				deltaPlusMm: m.deltaPlusMm
			});
			continue;
		}
		g.memberCount++;
		if (m.cMinMm > g.cMinMm) Object.assign(g, { cMinMm: m.cMinMm, cNomMm: m.cNomMm });
	}
	return [...groups.values()];
}

/**
 * Saves the survey's plan (one a survey; a new one replaces it), computed by the engine, and
 * audits it in the same transaction. A submitted or approved survey's plan is frozen with it.
 */
export async function saveSurveyPlan(actor: Actor, surveyId: number, input: SurveyPlanInput) {
	const { survey } = await scopedSurvey(actor, surveyId, 'write');
	// Refused before the computation too, which a frozen survey need not wait for.
	assertSurveyEditable(survey);
	const populations = await Promise.all(input.populations.map((p) => toPlan(survey, p)));
	const result = await computePlan(input.settings, populations);
	return SurveyPlan.sequelize!.transaction(async (transaction) => {
		await assertSurveyEditableLocked(survey, transaction);
		const existing = await SurveyPlan.findOne({ where: { surveyId }, transaction });
		const values = {
			settings: input.settings,
			populations: input.populations,
			result,
			engineVersion: ENGINE_VERSION,
			updatedByUserId: actor.userId
		};
		const plan = existing
			? await existing.update(values, { transaction })
			: await SurveyPlan.create({ surveyId, ...values }, { transaction });
		await recordAudit(
			{
				action: existing ? 'survey_plan.updated' : 'survey_plan.created',
				organisationId: actor.organisationId,
				userId: actor.userId,
				subjectType: 'survey',
				subjectId: surveyId,
				detail: {
					planId: plan.id,
					populations: result.map((p) => ({
						population: `${p.memberType} × ${p.exposureClass}`,
						readings: p.totalReadings,
						governing: p.governing.criterion
					}))
				}
			},
			transaction
		);
		return plan.id;
	});
}

/** Removes the survey's plan (audited); the survey and its readings are untouched. */
export async function deleteSurveyPlan(actor: Actor, surveyId: number) {
	const { survey } = await scopedSurvey(actor, surveyId, 'write');
	return SurveyPlan.sequelize!.transaction(async (transaction) => {
		await assertSurveyEditableLocked(survey, transaction);
		const removed = await SurveyPlan.destroy({ where: { surveyId }, transaction });
		if (removed) {
			await recordAudit(
				{
					action: 'survey_plan.deleted',
					organisationId: actor.organisationId,
					userId: actor.userId,
					subjectType: 'survey',
					subjectId: surveyId
				},
				transaction
			);
		}
		return removed > 0;
	});
}

/** Whether the survey has a saved plan (for a link to it). */
export async function hasSurveyPlan(surveyId: number): Promise<boolean> {
	return (await SurveyPlan.count({ where: { surveyId } })) > 0;
}
