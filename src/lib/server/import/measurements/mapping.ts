import { z } from 'zod';
import { importStartSchema } from '../mapping';

import { CARBONATION_FIELDS, CHLORIDE_FIELDS } from '$lib/intake/measurementColumns';

export type CarbonationField = (typeof CARBONATION_FIELDS)[number][0];
export type ChlorideField = (typeof CHLORIDE_FIELDS)[number][0];

const column = z.number().int().min(0).max(499).nullable().default(null);
const columnsOf = <F extends string>(fields: readonly (readonly [F, string, string])[]) =>
	Object.fromEntries(fields.map(([f]) => [f, column])) as Record<F, typeof column>;

export const carbonationMappingSchema = z
	.object({
		...columnsOf(CARBONATION_FIELDS),
		label: z.number({ error: 'Choose the column that holds the test location.' }).int().min(0),
		testedOn: z.number({ error: 'Choose the column that holds the test date.' }).int().min(0)
	})
	.strict();
export type CarbonationMapping = z.infer<typeof carbonationMappingSchema>;

export const chlorideMappingSchema = z
	.object({
		...columnsOf(CHLORIDE_FIELDS),
		label: z.number({ error: 'Choose the column that holds the profile label.' }).int().min(0),
		testedOn: z.number({ error: 'Choose the column that holds the test date.' }).int().min(0),
		fromMm: z.number({ error: 'Choose the column that holds the from-depth.' }).int().min(0),
		toMm: z.number({ error: 'Choose the column that holds the to-depth.' }).int().min(0),
		chloridePercent: z
			.number({ error: 'Choose the column that holds the chloride content.' })
			.int()
			.min(0),
		basis: z.number({ error: 'Choose the column that holds the basis.' }).int().min(0)
	})
	.strict();
export type ChlorideMapping = z.infer<typeof chlorideMappingSchema>;

const SUGGESTIONS: Record<'carbonation' | 'chloride', [string, RegExp][]> = {
	carbonation: [
		['memberLabel', /member|element/i],
		['label', /location|test|core|label|point/i],
		['testedOn', /date|tested|taken/i],
		['depthMin', /min/i],
		['depthMax', /max/i],
		['depthMean', /mean|average|avg/i],
		['depths', /depth|reading|carbonat/i],
		['x', /^\s*x\b/i],
		['y', /^\s*y\b/i],
		['method', /method|indicator/i],
		['notes', /note|comment|remark/i]
	],
	chloride: [
		['memberLabel', /member|element/i],
		['label', /profile|location|core|label/i],
		['testedOn', /date|tested|taken/i],
		['fromMm', /from|start|top/i],
		['toMm', /\bto\b|end|bottom/i],
		['chloridePercent', /chloride|cl|content/i],
		['basis', /basis|of mass|by mass/i],
		['binderContent', /binder|cement content/i],
		['concreteDensity', /density/i],
		['initialContent', /background|initial|\bci\b/i],
		['x', /^\s*x\b/i],
		['y', /^\s*y\b/i],
		['method', /method/i],
		['notes', /note|comment|remark/i]
	]
};

/** A first guess of a measurement file's mapping from its headers; the user checks it. */
export function suggestMeasurementMapping(
	kind: 'carbonation' | 'chloride',
	headers: readonly string[]
): Record<string, number> {
	const mapping: Record<string, number> = {};
	const taken = new Set<number>();
	for (const [field, pattern] of SUGGESTIONS[kind]) {
		const index = headers.findIndex((h, i) => !taken.has(i) && pattern.test(h));
		if (index >= 0) {
			mapping[field] = index;
			taken.add(index);
		}
	}
	return mapping;
}

/** The start request's mapping for a batch of `kind`; readings keep their own schema. */
export function measurementMappingSchema(kind: 'carbonation' | 'chloride') {
	return kind === 'carbonation' ? carbonationMappingSchema : chlorideMappingSchema;
}

/** The start request's whole body for a batch of `kind`. */
export function startSchemaFor(kind: 'readings' | 'carbonation' | 'chloride') {
	return kind === 'readings'
		? importStartSchema
		: importStartSchema.extend({ mapping: measurementMappingSchema(kind) });
}
