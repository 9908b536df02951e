import { z } from 'zod';
import { DESIGN_CODES, MEMBER_FACES, MEMBER_TYPES } from '$lib/words';

/**
 * The research selection: which opted-in readings a view, statistic or export covers. Every
 * field is a list (empty = no restriction); in a query string a field repeats
 * (`?memberType=deck&memberType=slab`) or takes a comma list (`?memberType=deck,slab`).
 */
const list = <T extends z.ZodType>(item: T) => z.array(item).max(50).default([]);

export const exposureClassSchema = z
	.string()
	.regex(/^[A-Za-z][A-Za-z0-9]{0,7}$/, 'an exposure class is letters and digits, e.g. XC3 or XD1');

export const GROUP_KEYS = [
	'memberType',
	'exposureClass',
	'face',
	'designCode',
	'decade',
	'cNomMm'
] as const;
export type GroupKey = (typeof GROUP_KEYS)[number];

export const researchFilterSchema = z.object({
	memberType: list(z.enum(MEMBER_TYPES)).describe('Member types, e.g. deck, slab, beam.'),
	exposureClass: list(exposureClassSchema).describe('Exposure classes, e.g. XC3, XD3.'),
	face: list(z.enum(MEMBER_FACES)).describe('Faces surveyed: top, bottom, side.'),
	designCode: list(z.enum(DESIGN_CODES)).describe('Design code of the structure.'),
	decade: list(
		z.coerce
			.number()
			.int()
			.min(1850)
			.max(2100)
			.refine((y) => y % 10 === 0, 'a decade is a year ending in 0, e.g. 1990')
	).describe('Decade of construction (its first year), e.g. 1990.'),
	cNomMm: list(z.coerce.number().min(0).max(300)).describe('Specified nominal cover c_nom in mm.')
});
export type ResearchFilter = z.infer<typeof researchFilterSchema>;

export const groupBySchema = z
	.array(z.enum(GROUP_KEYS))
	.max(3, 'group by at most three fields')
	.default(['memberType', 'exposureClass']);

const FIELDS = Object.keys(researchFilterSchema.shape) as (keyof ResearchFilter)[];

/** Every value of one query-string field, repeated or comma-listed, blanks dropped. */
export function listParam(params: URLSearchParams, name: string): string[] {
	return params
		.getAll(name)
		.flatMap((v) => v.split(','))
		.map((v) => v.trim())
		.filter(Boolean);
}

/** The filter's fields from a query string, unvalidated (zod checks them next). */
export function filterInput(params: URLSearchParams): Record<string, string[]> {
	return Object.fromEntries(FIELDS.map((f) => [f, listParam(params, f)]));
}

/** A filter as a query string, for links and the explorer's URL (empty fields left out). */
export function filterToParams(filter: ResearchFilter): URLSearchParams {
	const params = new URLSearchParams();
	for (const field of FIELDS) {
		for (const value of filter[field]) params.append(field, String(value));
	}
	return params;
}
