import { z } from 'zod';
import { RULE_SETS, type RuleSetName } from '$lib/analysis';
import { MEMBER_TYPES } from '$lib/words';
import { optionalNumber, requiredNumber, text } from './schemas';

/**
 * Input of a survey plan: the settings the rules are planned with and the populations to read.
 * Shared by the plan page's form, the API and its OpenAPI document.
 */

/**
 * Expected standard deviation of cover when the asset has no earlier readings of a population:
 * 8 mm, a stated default within the 5–10 mm that in-situ cover commonly scatters by (common
 * practice; from memory, not a table). The plan names it as assumed wherever it is used.
 */
export const DEFAULT_COVER_SD_MM = 8;

const ruleSetNames = Object.keys(RULE_SETS) as [RuleSetName, ...RuleSetName[]];
const share = (label: string, min: number, max: number, fallback: number) =>
	requiredNumber(label, min, max).default(fallback);
const whole = (label: string, min: number, max: number, fallback: number) =>
	requiredNumber(label, min, max)
		.pipe(z.number().int(`${label} must be a whole number.`))
		.default(fallback);

export const planSettingsSchema = z
	.object({
		ruleSet: z
			.enum(ruleSetNames, `The rule set is one of ${ruleSetNames.join(', ')}.`)
			.default('en-statistical'),
		method: z
			.enum(
				['prediction', 'tolerance', 'model', 'empirical'],
				'The method is prediction, tolerance, model or empirical.'
			)
			.default('prediction'),
		model: z
			.enum(['best-fit', 'normal', 'lognormal'], 'The model is best-fit, normal or lognormal.')
			.default('best-fit'),
		fractileP: share('The fractile', 0.001, 0.2, 0.05),
		confidence: share('The confidence', 0.75, 0.995, 0.95),
		minSampleSize: whole('The minimum sample size', 2, 500, 20),
		marginMm: share('The penalty margin (mm)', 0.1, 50, 2),
		p0: share('p0', 0.0001, 0.5, 0.01),
		p1: share('p1', 0.001, 0.6, 0.1),
		alpha: share('α', 0.001, 0.5, 0.05),
		beta: share('β', 0.001, 0.5, 0.1),
		seed: whole('The seed', 0, 2_147_483_647, 1),
		replicates: whole('The draws a point', 20, 2000, 400)
	})
	.refine((s) => s.p0 < s.p1, { message: 'p0 must be below p1.', path: ['p1'] });

export const plannedPopulationSchema = z.object({
	memberType: z.enum(MEMBER_TYPES, `The member type is one of ${MEMBER_TYPES.join(', ')}.`),
	exposureClass: text(24).min(1, 'Give the exposure class.'),
	memberCount: whole('The number of members', 1, 500, 1),
	/** null: from the asset's previous survey of this population, else DEFAULT_COVER_SD_MM. */
	sdMm: optionalNumber('The expected SD (mm)', 0.1, 100),
	cMinMm: requiredNumber('c_min (mm)', 1, 300),
	cNomMm: requiredNumber('c_nom (mm)', 1, 300),
	deltaPlusMm: optionalNumber('Δplus (mm)', 0, 100)
});

export const surveyPlanSchema = z
	.object({
		settings: planSettingsSchema,
		populations: z
			.array(plannedPopulationSchema)
			.min(1, 'Plan at least one population.')
			.max(12, 'At most 12 populations a plan.')
	})
	.superRefine((plan, ctx) => {
		const seen = new Set<string>();
		plan.populations.forEach((p, i) => {
			const key = `${p.memberType}|${p.exposureClass.toUpperCase()}`;
			if (seen.has(key))
				ctx.addIssue({
					code: 'custom',
					message: `${p.memberType} × ${p.exposureClass} is planned twice.`,
					path: ['populations', i, 'exposureClass']
				});
			seen.add(key);
			if (p.cMinMm > p.cNomMm)
				ctx.addIssue({
					code: 'custom',
					message: 'c_min cannot be above c_nom.',
					path: ['populations', i, 'cMinMm']
				});
		});
	});

export type PlanSettingsInput = z.infer<typeof planSettingsSchema>;
export type PlannedPopulationInput = z.infer<typeof plannedPopulationSchema>;
export type SurveyPlanInput = z.infer<typeof surveyPlanSchema>;
