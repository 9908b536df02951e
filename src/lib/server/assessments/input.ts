/** What a client sends to save an assessment, checked with zod. */
import { z } from 'zod';
import { calibrationSchema, methodSchema, SPLITS } from '$lib/server/populations';

export const saveSchema = z.object({
	title: z
		.string()
		.trim()
		.min(3, 'Give the assessment a title of at least 3 characters.')
		.max(160, 'The title is at most 160 characters.'),
	survey: z.number().int().positive().nullable().default(null),
	/** The surveys whose readings count; absent or null, the approved surveys of the asset. */
	surveys: z
		.array(z.number().int().positive())
		.min(1, 'Include at least one survey, or leave surveys out for the approved ones.')
		.max(200)
		.nullable()
		.default(null),
	split: z.enum(SPLITS).default('none'),
	/**
	 * The custom populations the assessment carries, by id; absent or null, every one the asset
	 * has (what an engineer who made them to judge them expects); [] for none.
	 */
	custom: z
		.array(z.number().int().positive(), 'Choose the custom populations by id.')
		.max(500, 'At most 500 custom populations.')
		.nullable()
		.default(null),
	methods: methodSchema.default(methodSchema.parse({})),
	/**
	 * 'apply': each population is also judged through its members' check-hole calibration,
	 * shown beside the verdict as read (the verdict itself stays that of the readings).
	 */
	calibration: calibrationSchema.shape.calibration,
	recommendations: z
		.string()
		.trim()
		.max(20_000, 'Recommendations are at most 20,000 characters.')
		.nullable()
		.default(null),
	supersedes: z
		.object({
			id: z.number().int().positive(),
			reason: z
				.string()
				.trim()
				.min(10, 'Say in at least 10 characters why the approved assessment is replaced.')
				.max(2000, 'The reason is at most 2,000 characters.')
		})
		.nullable()
		.default(null)
});

export type SaveBody = z.infer<typeof saveSchema>;
