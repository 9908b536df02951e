import { describe, expect, it } from 'vitest';
import {
	counted,
	formatDate,
	formatDateTime,
	mm,
	NO_VALUE,
	num,
	percent,
	roundedPercent
} from '$lib/format';

describe('counted: one plural rule for every page', () => {
	it('says "1 member" and "2 members", never "1 members" or "2 row(s)"', () => {
		expect(counted(1, 'member')).toBe('1 member');
		expect(counted(2, 'member')).toBe('2 members');
		expect(counted(0, 'row')).toBe('0 rows');
		expect(counted(1, 'survey is', 'surveys are')).toBe('1 survey is');
		// Thousands grouped as British English writes them (common practice).
		expect(counted(2242, 'reading')).toBe('2,242 readings');
	});
});

describe('dates for people: one format, ISO 8601 order', () => {
	it('keeps a calendar date as it is and shortens a timestamp to its UTC day', () => {
		expect(formatDate('2026-03-02')).toBe('2026-03-02');
		expect(formatDate(new Date('2026-12-04T23:30:00Z'))).toBe('2026-12-04');
		expect(formatDate(null)).toBe('—');
		expect(formatDate(null, 'never')).toBe('never');
	});

	it('gives a moment to the minute, in UTC, saying so', () => {
		expect(formatDateTime('2026-12-04T16:23:25.123Z')).toBe('2026-12-04 16:23 UTC');
		expect(formatDateTime(new Date(Date.UTC(2026, 0, 5, 7, 9)))).toBe('2026-01-05 07:09 UTC');
		expect(formatDateTime(undefined)).toBe('—');
	});
});

// The app's one way of printing figures (pages and report); the rounding is JavaScript's
// Number.prototype.toFixed (ECMA-262 §21.1.3.3), the layout common practice ("31.5 mm", "4.2 %").
describe('figures as people read them', () => {
	it('prints lengths in mm and shares in % to the digits asked, and a dash for nothing', () => {
		expect(mm(31.46)).toBe('31.5 mm');
		expect(mm(30, 0)).toBe('30 mm');
		expect(percent(0.0423)).toBe('4.2 %');
		expect(percent(0.05, 0)).toBe('5 %');
		expect(num(0.48249, 3)).toBe('0.482');
		for (const f of [mm, percent, num]) {
			expect(f(null)).toBe(NO_VALUE);
			expect(f(undefined)).toBe(NO_VALUE);
		}
	});

	it('gives a projected share one decimal below 10 % and none above', () => {
		expect(roundedPercent(0.032)).toBe('3.2 %');
		expect(roundedPercent(0.0999)).toBe('10.0 %');
		expect(roundedPercent(0.1)).toBe('10 %');
		expect(roundedPercent(0.456)).toBe('46 %');
	});
});
