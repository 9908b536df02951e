import { describe, expect, it } from 'vitest';
import {
	filterInput,
	filterToParams,
	researchFilterSchema
} from '../../../src/lib/server/research/filter';
import { InvalidInputError, parseOrThrow } from '../../../src/lib/server/research/validate';

const parse = (query: string) =>
	parseOrThrow(researchFilterSchema, filterInput(new URLSearchParams(query)));

describe('research filter from a query string', () => {
	it('reads repeated and comma-listed values and coerces numbers', () => {
		const filter = parse('memberType=deck&memberType=slab&decade=1990,2000&cNomMm=45');
		expect(filter.memberType).toEqual(['deck', 'slab']);
		expect(filter.decade).toEqual([1990, 2000]);
		expect(filter.cNomMm).toEqual([45]);
		expect(filter.face).toEqual([]);
	});

	it('names the field of a bad value', () => {
		const cases: [string, string, RegExp][] = [
			['decade=1995', 'decade', /year ending in 0/],
			['memberType=bridge', 'memberType', /memberType/],
			['exposureClass=XC3;DROP', 'exposureClass', /letters and digits/],
			['cNomMm=abc', 'cNomMm', /cNomMm/]
		];
		for (const [query, field, message] of cases) {
			try {
				parse(query);
				expect.unreachable(`${query} was accepted`);
			} catch (e) {
				expect(e).toBeInstanceOf(InvalidInputError);
				expect((e as InvalidInputError).field).toBe(field);
				expect((e as Error).message).toMatch(message);
			}
		}
	});

	it('round-trips through the URL', () => {
		const filter = parse('memberType=beam&exposureClass=XC3&decade=2000');
		expect(parse(filterToParams(filter).toString())).toEqual(filter);
	});

	it('accepts an empty query as the whole selection', () => {
		expect(researchFilterSchema.parse({})).toMatchObject({ memberType: [], decade: [] });
	});
});
