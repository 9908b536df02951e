import { z } from 'zod';
import { plannedPopulationSchema, planSettingsSchema } from '$lib/intake/plan';
import { isoTime } from './intakeAnswers';

/**
 * Shapes of the survey plan's answers (src/lib/server/planning): the inputs as saved (the
 * request's schemas, output side) and the engine's figures, each curve naming its method.
 */
const share = z.number().min(0).max(1);
const count = z.number().int().min(0);

const criterionSchema = z.object({
	id: z.string().describe('penalty, minimum-sample, or the id of a rule'),
	label: z.string(),
	n: count.nullable().describe('Readings the criterion needs; null when no n up to 5000 does.'),
	note: z.string().nullable()
});

const curveSchema = z.object({
	id: z.string().describe('A rule id, or rule-set for the whole rule set.'),
	label: z.string(),
	method: z
		.enum(['exact-binomial', 'noncentral-t', 'simulation'])
		.describe('How the curve was obtained.'),
	points: z.array(z.object({ p: share, accept: share }))
});

export const populationPlanAnswerSchema = z
	.object({
		memberType: z.string(),
		exposureClass: z.string(),
		sdMm: z.number().describe('Expected SD of cover, mm.'),
		sdBasis: z.string().describe('Where the SD comes from: measured, entered or assumed.'),
		cMinMm: z.number(),
		criteria: z.array(criterionSchema),
		governing: z.object({ n: count, criterion: z.string() }),
		penaltyAtNMm: z.number().describe('(k − z)·s at the planned total, mm.'),
		memberCount: count,
		readingsPerMember: count,
		totalReadings: count,
		curves: z.array(curveSchema),
		atP0: share.describe('Simulated probability that the rule set passes a population at p0.'),
		atP1: share.describe('Simulated probability that the rule set passes a population at p1.'),
		measuredReadings: count,
		measuredMembers: count
	})
	.meta({ id: 'PopulationPlan' });

export const memberPlanRowSchema = z.object({
	memberId: z.number().int(),
	label: z.string(),
	memberType: z.string(),
	exposureClass: z.string(),
	planned: count.nullable().describe('Readings the plan asks of the member; null if not planned.'),
	measured: count
});

export const surveyPlanAnswerSchema = z
	.object({
		plan: z.object({
			surveyId: z.number().int(),
			settings: planSettingsSchema,
			populations: z.array(plannedPopulationSchema),
			result: z.array(populationPlanAnswerSchema),
			engineVersion: z.string(),
			updatedAt: isoTime,
			members: z.array(memberPlanRowSchema)
		})
	})
	.meta({ id: 'SurveyPlanAnswer' });
