import { describe, expect, it } from 'vitest';
import { DuplicateFinder } from '$lib/server/import/dedupe';

const reading = (i: number, coverMm = 30) => ({
	memberId: 1 + (i % 7),
	xMm: i,
	yMm: 0,
	coverMm,
	barDiameterMm: null,
	barSpacingMm: null,
	barDirection: null,
	note: null
});

describe('DuplicateFinder', () => {
	it('names the earlier row of an exact repeat and nothing else, across growth', () => {
		const finder = new DuplicateFinder();
		let falseMatches = 0;
		for (let i = 0; i < 200_000; i++)
			if (finder.check(reading(i), i + 2) !== undefined) falseMatches++;
		expect(falseMatches).toBe(0);
		expect(finder.check(reading(12_345), 999_999)).toBe(12_347);
		expect(finder.check(reading(12_345, 30.1), 1_000_000)).toBeUndefined();
		expect(finder.check({ ...reading(5), note: 'lap' }, 1_000_001)).toBeUndefined();
	});
});
