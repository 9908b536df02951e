import { describe, expect, it } from 'vitest';
import {
	carbonationDepths,
	carbonationTestSchema,
	chlorideProfileSchema,
	concreteAgeYears,
	conversionNote,
	percentOfBinder
} from '../../../src/lib/intake/measurements';

const profile = {
	label: 'CP1',
	testedOn: '2026-02-10',
	basis: 'binder',
	increments: '0 5 3.1\n5 10 2.6\n\n10 20 1.9'
};

describe('chloride profile input', () => {
	it('reads increments typed one a line (blank lines skipped, decimal commas accepted)', () => {
		const parsed = chlorideProfileSchema.parse({ ...profile, increments: '0\t5\t3,1\n5 10 2.6' });
		expect(parsed.increments).toEqual([
			{ fromMm: 0, toMm: 5, chloridePercent: 3.1 },
			{ fromMm: 5, toMm: 10, chloridePercent: 2.6 }
		]);
		expect(chlorideProfileSchema.parse(profile).increments).toHaveLength(3);
	});

	it('names the line that is not three numbers, and the increment out of order', () => {
		const bad = chlorideProfileSchema.safeParse({ ...profile, increments: '0 5 3.1\n5 10' });
		expect(bad.error?.issues[0].message).toMatch(/^Line 2: /);
		const gap = chlorideProfileSchema.safeParse({ ...profile, increments: '0 5 3\n4 8 2' });
		expect(gap.error?.issues[0].message).toMatch(/^Increment 2 \(4–8 mm\): overlaps/);
	});

	it('converts % of concrete to % of binder through the chloride per m³ (worked by hand)', () => {
		// 0.3 % of 2400 kg/m³ concrete is 7.2 kg/m³ of chloride; over 300 kg/m³ binder, 2.4 %.
		const basis = { basis: 'concrete' as const, binderContentKgM3: 300, concreteDensityKgM3: 2400 };
		expect(percentOfBinder(0.3, basis)).toBeCloseTo(2.4, 12);
		expect(percentOfBinder(0.3, { ...basis, basis: 'binder' })).toBe(0.3);
		expect(conversionNote(basis)).toContain('2400 kg/m³ (assumed concrete density)');
		expect(conversionNote({ ...basis, basis: 'binder' })).toBeNull();
	});
});

describe('carbonation test input', () => {
	const test = { label: 'CT1', testedOn: '2025-06-18' };

	it('keeps min, mean and max as read, and says when they come from the readings', () => {
		const asRead = carbonationTestSchema.parse({
			...test,
			depthMinMm: '9',
			depthMeanMm: '11.2',
			depthMaxMm: '13'
		});
		expect(carbonationDepths(asRead)).toEqual({
			minMm: 9,
			meanMm: 11.2,
			maxMm: 13,
			meanSource: 'as read'
		});
		const readings = carbonationTestSchema.parse({ ...test, depthsMm: '8 10 12 14' });
		expect(carbonationDepths(readings)).toEqual({
			minMm: 8,
			meanMm: 11,
			maxMm: 14,
			meanSource: 'from the 4 readings'
		});
	});

	it('refuses a test with no depth at all', () => {
		const none = carbonationTestSchema.safeParse(test);
		expect(none.error?.issues[0].path).toEqual(['depthsMm']);
	});
});

describe('age of the concrete at a test', () => {
	it('counts from mid-year of construction in Julian years', () => {
		// 1 July 2009 to 1 July 2025 is 5844 days (four 29 Februaries): 5844 / 365.25 = 16 years.
		expect(concreteAgeYears(2009, '2025-07-01')).toBeCloseTo(5844 / 365.25, 12);
	});
});
