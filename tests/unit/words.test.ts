import { describe, expect, it } from 'vitest';
import {
	counted,
	formatDate,
	formatDateTime,
	customPopulationWords,
	memberLowAreaWords,
	treatFirstWords
} from '../../src/lib/words';

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

describe('low areas in words, small spots kept apart', () => {
	const bay = {
		memberLabel: 'L2-BAY-04',
		populationLabel: 'deck · XD3',
		areaCount: 1,
		areaM2: 7.84,
		spotCount: 17,
		spotM2: 4.25
	};
	it('names the member to treat first and counts its small spots apart', () => {
		expect(treatFirstWords([bay])).toBe(
			'Treat first: member L2-BAY-04 (deck · XD3), one area below c_min, 7.8 m² (and 17 small spots, 4.3 m² in all).'
		);
		expect(memberLowAreaWords(bay)).toBe('one area, 7.8 m²; 17 small spots, 4.3 m² in all');
		expect(memberLowAreaWords({ ...bay, spotCount: 1, spotM2: 0.25 })).toBe(
			'one area, 7.8 m²; 1 small spot, 0.3 m² in all'
		);
	});
	it('says when only small spots are found, and reads a summary without spots as before', () => {
		const spotsOnly = { ...bay, areaCount: 0, areaM2: 0, spotCount: 2, spotM2: 0.5 };
		expect(treatFirstWords([spotsOnly])).toBe(
			'No area large enough to treat first; one member has 2 small spots, 0.5 m² in all below c_min.'
		);
		const older = { memberLabel: 'W-01', populationLabel: 'wall · XC3', areaCount: 2, areaM2: 14 };
		expect(treatFirstWords([older])).toBe(
			'Treat first: member W-01 (wall · XC3), two areas below c_min, 14 m².'
		);
	});
});

describe('a custom population in the owner’s words', () => {
	const judged = (verdict: 'pass' | 'fail', labels: string[], rest = false) => ({
		key: rest ? { rest: true } : {},
		members: labels.map((label) => ({ label })),
		assessment: { verdict }
	});
	it('says which member was judged apart from which group, and both verdicts', () => {
		const words = customPopulationWords({
			custom: { name: 'Low bay', splitFromLabel: 'deck · XD3' },
			populations: [judged('fail', ['L2-BAY-04']), judged('pass', ['L2-BAY-01', 'L2-BAY-02'], true)]
		});
		expect(words).toBe(
			'The engineer judged member L2-BAY-04 apart from the rest of deck · XD3 (“Low bay”): does not comply; the rest of deck · XD3 without it: complies.'
		);
	});
	it('names a hand-picked set together, shortening a long list', () => {
		const words = customPopulationWords({
			custom: { name: 'North edge', splitFromLabel: null },
			populations: [judged('pass', ['A', 'B', 'C', 'D', 'E', 'F'])]
		});
		expect(words).toBe(
			'The engineer judged members A, B, C and 3 more together as “North edge”: complies.'
		);
	});
});
