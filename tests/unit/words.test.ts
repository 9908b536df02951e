import { describe, expect, it } from 'vitest';
import { counted, formatDate, formatDateTime } from '../../src/lib/words';

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

describe('rule set words', () => {
	it('names every rule set the engine has in words, never by its key', async () => {
		const { RULE_SETS } = await import('$lib/analysis/rules/ruleSets');
		const { ruleSetWords } = await import('$lib/words');
		for (const name of Object.keys(RULE_SETS)) {
			expect(ruleSetWords(name)).not.toBe(name);
			expect(ruleSetWords(name)).not.toMatch(/^[a-z]+-[a-z]+$/);
		}
	});
});
