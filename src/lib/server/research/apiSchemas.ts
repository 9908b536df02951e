import { z } from 'zod';
import { EXPORT_FORMATS } from './exportRecord';
import { GROUP_KEYS, groupBySchema, listParam, researchFilterSchema } from './filter';
import { researchMemberSchema, researchReadingSchema } from './schemas';

/** Shapes of the research API's answers, for the routes and the OpenAPI document. */
const loose = (what: string) => z.record(z.string(), z.unknown()).describe(what);

export const populationFiguresSchema = z
	.object({
		description: z.object({
			n: z.number().int(),
			meanMm: z.number(),
			sdMm: z.number(),
			cov: z.number().nullable(),
			minMm: z.number(),
			maxMm: z.number(),
			medianMm: z.number(),
			skewness: z.number().nullable()
		}),
		percentiles: z.array(z.object({ p: z.number(), valueMm: z.number() })),
		models: loose('Normal and lognormal fits with goodness of fit (engine ModelComparison).'),
		characteristic: loose('Characteristic values by every method (engine CharacteristicCovers).'),
		charts: loose('Histogram, ECDF, fitted curves, probability plot (when charts=true).').nullable()
	})
	.nullable()
	.meta({ id: 'PopulationFigures' });

export const groupStatisticsSchema = z
	.object({
		key: z.record(z.string(), z.union([z.string(), z.number(), z.null()])),
		readingCount: z.number().int(),
		memberCount: z.number().int(),
		assetCount: z.number().int(),
		cover: populationFiguresSchema,
		deviationFromNominal: populationFiguresSchema,
		belowCMin: loose('Share below c_min with its Clopper–Pearson interval.').nullable()
	})
	.meta({ id: 'GroupStatistics' });

export const researchStatisticsSchema = z.object({
	engineVersion: z.string(),
	filter: z.record(z.string(), z.array(z.union([z.string(), z.number()]))),
	groupBy: z.array(z.enum(GROUP_KEYS)),
	selection: groupStatisticsSchema,
	groups: z.array(groupStatisticsSchema)
});

export const exportSummarySchema = z
	.object({
		id: z.number().int(),
		format: z.enum(EXPORT_FORMATS),
		filter: z.unknown(),
		rowCount: z.number().int().nullable().describe('null: the download did not finish.'),
		engineVersion: z.string(),
		createdAt: z.string().describe('ISO 8601, UTC.')
	})
	.meta({ id: 'ResearchExport' });

export const exportManifestSchema = z.object({
	export: exportSummarySchema,
	citation: z.string(),
	readme: z.string().describe('The README of the export (Markdown).'),
	dictionary: loose('JSON Schema (2020-12) of every column.')
});

export const researchMemberListSchema = z.object({ members: z.array(researchMemberSchema) });
export const researchReadingPageSchema = z.object({
	readings: z.array(researchReadingSchema),
	nextCursor: z.string().nullable()
});
export const exportListSchema = z.object({ exports: z.array(exportSummarySchema) });

/** Query of the statistics and groups export: the filter plus grouping and options. */
export const statisticsQuerySchema = researchFilterSchema.extend({
	groupBy: groupBySchema.describe('Fields to group by, at most three.'),
	charts: z
		.enum(['true', 'false'])
		.default('false')
		.transform((v) => v === 'true')
		.describe('Include chart data for the whole selection.')
});

/** The statistics query from a URL: list fields as lists, single ones as they are. */
export function statisticsInput(params: URLSearchParams): Record<string, unknown> {
	const out: Record<string, unknown> = {};
	for (const key of Object.keys(researchFilterSchema.shape)) out[key] = listParam(params, key);
	const groupBy = listParam(params, 'groupBy');
	if (groupBy.length) out.groupBy = groupBy;
	if (params.has('charts')) out.charts = params.get('charts');
	return out;
}

export const consentSchema = z
	.object({
		assetId: z.number().int(),
		researchOptIn: z.boolean(),
		changedAt: z.string().nullable().describe('When consent last changed (ISO 8601).')
	})
	.meta({ id: 'ResearchConsent' });

export const consentBodySchema = z.object({
	researchOptIn: z.boolean({ error: 'researchOptIn must be true or false' })
});
