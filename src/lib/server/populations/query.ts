/**
 * The population query: which readings, how they are grouped and which methods judge them.
 * One zod schema for the API's query string and the page URL, so a view can be bookmarked.
 */
import { z } from 'zod';
import { RULE_SETS, type AssessOptions, type RuleSetName } from '$lib/analysis';
import { MEMBER_FACES, MEMBER_TYPES } from '$lib/words';

/** Groups are member type × exposure class, optionally split further by one of these. */
export const SPLITS = ['none', 'face', 'survey', 'member'] as const;
export type Split = (typeof SPLITS)[number];

const id = z.coerce.number().int().positive().max(4_294_967_295);
const ruleSetNames = Object.keys(RULE_SETS) as [RuleSetName, ...RuleSetName[]];

export const methodSchema = z.object({
	fractile: z.coerce
		.number()
		.gt(0, 'The fractile must be above 0.')
		.max(0.2, 'The fractile must be at most 0.2 (20 %).')
		.default(0.05),
	confidence: z.coerce
		.number()
		.min(0.75, 'The confidence must be at least 0.75.')
		.max(0.995, 'The confidence must be at most 0.995.')
		.default(0.95),
	percentile: z.enum(['6', '7'], 'The percentile definition is type 6 or type 7.').default('7'),
	model: z
		.enum(['best-fit', 'normal', 'lognormal'], 'The model is best-fit, normal or lognormal.')
		.default('best-fit'),
	method: z
		.enum(
			['prediction', 'tolerance', 'model', 'empirical'],
			'The method is prediction, tolerance, model or empirical.'
		)
		.default('prediction'),
	rules: z.enum(ruleSetNames, `The rule set is one of ${ruleSetNames.join(', ')}.`).optional()
});

/** A list of survey ids, "3,5" (at most 200), or "none" for an explicit empty choice. */
const idList = z
	.string()
	.trim()
	.regex(
		/^(none|\d{1,10}(,\d{1,10}){0,199})$/,
		'Give the surveys as ids separated by commas, e.g. 3,5, or none.'
	)
	.transform((text) => (text === 'none' ? [] : [...new Set(text.split(',').map(Number))]))
	.pipe(z.array(z.number().int().positive().max(4_294_967_295)));

export const scopeSchema = z.object({
	/** One survey (the older form of `surveys`). */
	survey: id.optional(),
	/** The surveys whose readings count; absent, the approved ones (selection.ts). */
	surveys: idList.optional(),
	split: z.enum(SPLITS, `Split by one of ${SPLITS.join(', ')}.`).default('none')
});

/** One population, picked out of the overview by its group key. */
export const groupSchema = z.object({
	type: z.enum(MEMBER_TYPES, `The member type is one of ${MEMBER_TYPES.join(', ')}.`),
	exposure: z
		.string()
		.trim()
		.min(1, 'Give the exposure class.')
		.max(24, 'The exposure class is at most 24 characters.'),
	face: z.enum(MEMBER_FACES).optional(),
	member: id.optional()
});

/** A custom population picked by id, and which part of a split (the chosen members or the rest). */
export const customSchema = z.object({
	custom: id,
	part: z.enum(['chosen', 'rest'], 'The part is chosen or rest.').default('chosen')
});

/**
 * Whether the meter's check-hole calibration is applied to the population's readings (detail
 * only): none, as the meter logged them (the default), or apply.
 */
export const calibrationSchema = z.object({
	calibration: z.enum(['none', 'apply'], 'The calibration is none or apply.').default('none')
});

export type MethodChoice = z.infer<typeof methodSchema>;
export type CalibrationChoice = z.infer<typeof calibrationSchema>['calibration'];
export type PopulationScope = z.infer<typeof scopeSchema>;
export type GroupSelector = z.infer<typeof groupSchema>;

/** The engine's options for a method choice. */
export function toAssessOptions(choice: MethodChoice, charts = false): AssessOptions {
	return {
		fractileP: choice.fractile,
		confidence: choice.confidence,
		percentileType: choice.percentile === '6' ? 6 : 7,
		model: choice.model,
		characteristicMethod: choice.method,
		...(choice.rules ? { ruleSet: choice.rules } : {}),
		charts
	};
}
