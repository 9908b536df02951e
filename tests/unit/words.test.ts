/**
 * The domain's words as people read them ($lib/words): rule sets, low-cover areas and custom
 * populations. Expected texts are our own wording, written out in full.
 */
import { describe, expect, it } from 'vitest';
import {
	calibrationOwnerWords,
	customPopulationWords,
	memberLowAreaWords,
	treatFirstWords
} from '$lib/words';

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

describe('the check-hole calibration in words for the owner', () => {
	const population = (
		asRead: 'pass' | 'fail',
		calibrated: 'pass' | 'fail' | null,
		problem: string | null = null
	) => ({
		label: 'deck · XD3',
		calibration: {
			asRead,
			calibrated: calibrated
				? { calibration: { n: 4 }, assessment: { verdict: calibrated } }
				: null,
			problem
		}
	});

	it('says the outcome stays, or how it changes, and counts the holes', () => {
		expect(calibrationOwnerWords(population('fail', 'fail'))).toBe(
			'deck · XD3: the cover meter was checked against 4 holes drilled to the steel; with its readings corrected by them the outcome stays: does not comply.'
		);
		expect(calibrationOwnerWords(population('pass', 'fail'))).toBe(
			'deck · XD3: the cover meter was checked against 4 holes drilled to the steel; with its readings corrected by them the outcome changes from complies to does not comply.'
		);
	});

	it('says why the meter could not be checked where there were too few holes', () => {
		expect(
			calibrationOwnerWords(
				population('pass', null, 'The calibration needs at least 3 check holes; there are 1.')
			)
		).toBe(
			'deck · XD3: the cover meter could not be checked here. The calibration needs at least 3 check holes; there are 1.'
		);
	});
});
