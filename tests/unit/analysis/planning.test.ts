import { describe, expect, it } from 'vitest';
import {
	acceptanceNumber,
	binomialCdf,
	characteristicPenaltyMm,
	characteristicRuleOc,
	planPopulation,
	readingsForPenalty,
	readingsForRule,
	simulateRuleSetOc,
	type PlanSettings,
	type RuleOcSettings
} from '$lib/analysis/planning';
import { ruleSetVerdict } from '$lib/analysis/planning/simulate';
import { assessPopulation } from '$lib/analysis';
import { resolveOptions } from '$lib/analysis/assessOptions';
import { projectRequirement } from '$lib/analysis/requirements/requirement';
import { mulberry32, normalSampler } from '$lib/analysis/durability/prng';

const rules: RuleOcSettings = {
	method: 'prediction',
	fractileP: 0.05,
	confidence: 0.95,
	minSampleSize: 20,
	allowedFractionBelow: 0.05,
	aciLimitAboveCMinMm: 0,
	sdMm: 8
};

describe('zero-failure demonstration (binomial; common practice: 0.95^59 < 0.05)', () => {
	it('needs 59 readings with none below c_min to show 95 % above it with 95 % confidence', () => {
		const d = { p0: 0.0001, p1: 0.05, alpha: 0.05, beta: 0.05 };
		expect(readingsForRule('every-reading-min', d, rules)).toEqual({ n: 59, note: null });
		expect(0.95 ** 59).toBeLessThan(0.05);
		expect(0.95 ** 58).toBeGreaterThan(0.05);
	});

	it('the Clopper–Pearson rule accepts no reading below at 59 readings (acceptance number 0)', () => {
		// scipy 1.17.1: largest c with beta.ppf(0.95, c + 1, n − c) ≤ 0.05 → 0, 1, 4, 16
		expect(acceptanceNumber(59, 0.05, 0.95)).toBe(0);
		expect(acceptanceNumber(100, 0.05, 0.95)).toBe(1);
		expect(acceptanceNumber(186, 0.05, 0.95)).toBe(4);
		expect(acceptanceNumber(500, 0.05, 0.95)).toBe(16);
	});

	it('says so when no reading allowed below cannot both accept p0 and reject p1', () => {
		const d = { p0: 0.01, p1: 0.05, alpha: 0.05, beta: 0.05 };
		const answer = readingsForRule('every-reading-min', d, rules);
		expect(answer.n).toBeNull();
		expect(answer.note).toMatch(/only 55\.3 %/); // 0.99^59 = 0.5527
	});
});

describe('binomial CDF against scipy.stats.binom.cdf (scipy 1.17.1)', () => {
	const cases: [number, number, number, number][] = [
		[0, 59, 0.05, 0.04849452524942322],
		[2, 100, 0.01, 0.9206267977478195],
		[5, 186, 0.05, 0.09289730256217428],
		[9, 186, 0.1, 0.008293200590954605],
		[40, 1000, 0.05, 0.080636573256691]
	];
	for (const [c, n, p, scipy] of cases) {
		it(`binom.cdf(${c}, ${n}, ${p}) = ${scipy}`, () => {
			// jstat's incomplete beta: within 2e-9 here (1.6e-9 at n = 1000)
			expect(Math.abs(binomialCdf(c, n, p) - scipy)).toBeLessThan(5e-9);
		});
	}
});

describe('characteristic rule OC against scipy.stats.nct.sf (scipy 1.17.1)', () => {
	// P(pass) = nct.sf(k·√n, n − 1, √n·norm.ppf(1 − p)), k_n = t.ppf(0.95, n − 1)·√(1 + 1/n)
	const prediction: [number, number, number][] = [
		[20, 0.01, 0.9421163882745446],
		[20, 0.1, 0.09727380097902098],
		[22, 0.01, 0.954066951352132],
		[22, 0.1, 0.09028022949230109],
		[60, 0.03, 0.84296457527574],
		[186, 0.08, 0.012937974220875632]
	];
	for (const [n, p, scipy] of prediction) {
		it(`prediction method, n = ${n}, p = ${p}: ${scipy}`, () => {
			expect(Math.abs(characteristicRuleOc(n, p, rules) - scipy)).toBeLessThan(1e-7);
		});
	}
	// k = nct.ppf(0.95, 29, norm.ppf(0.95)·√30)/√30 = 2.2198375320350565
	const tolerance: [number, number, number][] = [
		[30, 0.01, 0.64712736051951],
		[30, 0.1, 0.002740701101850389]
	];
	for (const [n, p, scipy] of tolerance) {
		it(`tolerance method, n = ${n}, p = ${p}: ${scipy}`, () => {
			const oc = characteristicRuleOc(n, p, { ...rules, method: 'tolerance' });
			expect(Math.abs(oc - scipy)).toBeLessThan(1e-6);
		});
	}
	it('answers 0 below the minimum sample size (the rule says not enough data)', () => {
		expect(characteristicRuleOc(19, 0.001, rules)).toBe(0);
	});
});

describe('readings for the penalty margin', () => {
	it('(k_n − z)·s, scipy 1.17.1: n = 10 gives 2.2219 mm, n = 11 gives 1.9856 mm at s = 8 mm', () => {
		expect(characteristicPenaltyMm(10, 8, 'prediction')).toBeCloseTo(2.221851492108195, 6);
		expect(characteristicPenaltyMm(11, 8, 'prediction')).toBeCloseTo(1.9856022053428788, 6);
		expect(readingsForPenalty(2, 8, 'prediction')).toBe(11);
	});
	it('the tolerance method needs more readings than the prediction method; the model none', () => {
		expect(readingsForPenalty(2, 8, 'tolerance')!).toBeGreaterThan(100);
		expect(characteristicPenaltyMm(5, 8, 'model')).toBe(0);
		expect(readingsForPenalty(2, 8, 'model')).toBe(2);
	});
	it('property: a larger SD never needs fewer readings', () => {
		let last = 0;
		for (const sd of [2, 4, 6, 8, 10, 12]) {
			const n = readingsForPenalty(1.5, sd, 'prediction')!;
			expect(n).toBeGreaterThanOrEqual(last);
			last = n;
		}
	});
});

describe('readings each rule needs to accept p0 and reject p1', () => {
	const d = { p0: 0.01, p1: 0.1, alpha: 0.05, beta: 0.1 };
	it('the found n meets both sides and n − 1 does not (characteristic rule)', () => {
		const { n } = readingsForRule('characteristic-min', d, rules);
		expect(n).toBe(22);
		expect(characteristicRuleOc(22, 0.01, rules)).toBeGreaterThanOrEqual(0.95);
		expect(characteristicRuleOc(22, 0.1, rules)).toBeLessThanOrEqual(0.1);
		expect(
			characteristicRuleOc(21, 0.01, rules) >= 0.95 && characteristicRuleOc(21, 0.1, rules) <= 0.1
		).toBe(false);
	});
	it('the Clopper–Pearson rule: the first n whose acceptance number meets both', () => {
		const { n } = readingsForRule('fraction-below-min', d, rules);
		expect(n).not.toBeNull();
		const c = acceptanceNumber(n!, 0.05, 0.95);
		expect(binomialCdf(c, n!, 0.01)).toBeGreaterThanOrEqual(0.95);
		expect(binomialCdf(c, n!, 0.1)).toBeLessThanOrEqual(0.1);
		for (let m = 20; m < n!; m++) {
			const cm = acceptanceNumber(m, 0.05, 0.95);
			const ok = cm >= 0 && binomialCdf(cm, m, 0.01) >= 0.95 && binomialCdf(cm, m, 0.1) <= 0.1;
			expect(ok).toBe(false);
		}
	});
});

describe('seeded simulation of the whole rule set', () => {
	const requirement = projectRequirement(45, 10);
	it('the shortcut verdict equals the population assessment verdict', () => {
		const draw = normalSampler(mulberry32(7));
		const options = resolveOptions(requirement, { ruleSet: 'full-review' });
		for (let r = 0; r < 40; r++) {
			const covers = Float64Array.from({ length: 25 }, () => 47 + 7 * draw()).sort();
			const full = assessPopulation(covers, requirement, { ruleSet: 'full-review' }).verdict;
			expect(ruleSetVerdict(covers, requirement, options)).toBe(full);
		}
	});
	it('is repeatable with a seed and agrees with the exact curve of a one-rule set', () => {
		// strict-minimum without Δplus is every-reading-min alone: (1 − p)^n exactly.
		const a = simulateRuleSetOc(
			30,
			[0.02, 0.05],
			8,
			requirement,
			{ ruleSet: 'strict-minimum' },
			2000,
			3
		);
		const b = simulateRuleSetOc(
			30,
			[0.02, 0.05],
			8,
			requirement,
			{ ruleSet: 'strict-minimum' },
			2000,
			3
		);
		expect(a).toEqual(b);
		for (const pt of a) {
			const exact = (1 - pt.p) ** 30;
			expect(Math.abs(pt.accept - exact)).toBeLessThan(4 * pt.standardError + 1e-9);
		}
	});
});

describe('planPopulation', () => {
	const settings: PlanSettings = {
		ruleSet: 'en-statistical',
		method: 'prediction',
		model: 'normal',
		fractileP: 0.05,
		confidence: 0.95,
		minSampleSize: 20,
		marginMm: 2,
		p0: 0.01,
		p1: 0.1,
		alpha: 0.05,
		beta: 0.1,
		seed: 1,
		replicates: 100
	};
	const plan = planPopulation(settings, {
		memberType: 'slab',
		exposureClass: 'XC3',
		memberCount: 6,
		requirement: projectRequirement(45, 10),
		sdMm: 8,
		sdBasis: 'stated default'
	});
	it('takes the largest n of the criteria and spreads it over the members', () => {
		const largest = Math.max(...plan.criteria.map((c) => c.n ?? 0));
		expect(plan.governing.n).toBe(largest);
		expect(plan.readingsPerMember).toBe(Math.ceil(largest / 6));
		expect(plan.totalReadings).toBe(plan.readingsPerMember * 6);
	});
	it('names the method of every curve', () => {
		expect(plan.curves.map((c) => [c.id, c.method])).toEqual([
			['characteristic-min', 'noncentral-t'],
			['fraction-below-min', 'exact-binomial'],
			['rule-set', 'simulation']
		]);
	});
	it('the whole rule set accepts p0 and rejects p1 at the planned n (simulated)', () => {
		expect(plan.atP0).toBeGreaterThanOrEqual(0.9);
		expect(plan.atP1).toBeLessThanOrEqual(0.1);
	});
});
