import { describe, expect, it } from 'vitest';
import { riskLevel, type LevelInput } from '$lib/server/risk/levels';
import { areaOfMembersM2 } from '$lib/server/risk/annex';
import { curveAges } from '$lib/server/risk/compute';
import {
	defaultParameters,
	durabilityParametersSchema,
	withDefaults
} from '$lib/server/risk/parameters';
import { modelKindFor, toDurabilityModel } from '$lib/server/risk/model';

const base: LevelInput = {
	shareBelowCMin: 0.02,
	cMinMm: 40,
	verdict: 'fail',
	designLifeYears: 50,
	ageAtSurveyYears: 26,
	probabilityNow: 0.01,
	meetsTargetNow: true,
	probabilityAtDesignLife: 0.05,
	meetsTargetAtDesignLife: true,
	firstAgeMissingTarget: null
};

describe('risk levels in plain words', () => {
	it('says act now when the target is already missed at the survey age', () => {
		const r = riskLevel({ ...base, probabilityNow: 0.42, meetsTargetNow: false });
		expect(r.level).toBe('act-now');
		expect(r.reason).toContain('42 %');
	});
	it('says plan repairs when the target is missed before the design life ends', () => {
		const r = riskLevel({ ...base, meetsTargetAtDesignLife: false, firstAgeMissingTarget: 45 });
		expect(r.level).toBe('plan-repairs');
		expect(r.reason).toContain('about 45 years');
	});
	it('says keep watching when protection holds but readings fall below c_min', () => {
		const r = riskLevel(base);
		expect(r.level).toBe('keep-watching');
		expect(r.reason).toContain('40 mm');
	});
	it('says low concern when the rules pass and protection holds', () => {
		expect(riskLevel({ ...base, verdict: 'pass' }).level).toBe('low-concern');
	});
	it('does not judge a population with too few readings', () => {
		expect(riskLevel({ ...base, verdict: null, shareBelowCMin: null }).level).toBe('not-judged');
	});
});

describe('durability parameters', () => {
	it('chooses the model from the exposure class', () => {
		expect(modelKindFor('XC3')).toBe('carbonation');
		expect(modelKindFor('XD3')).toBe('chloride');
		expect(modelKindFor('XS1')).toBe('chloride');
		expect(modelKindFor('XF1')).toBeNull();
		expect(defaultParameters('XD3')?.kind).toBe('chloride');
	});
	it('passes the chloride ageing exponent it was given (fib Bulletin 34 D(t) = D_ref(t_ref/t)^α)', () => {
		const parsed = durabilityParametersSchema.parse({
			XD3: {
				kind: 'chloride',
				surfaceContent: 3,
				initialContent: 0.1,
				criticalContent: 0.6,
				dM2PerS: 1e-12,
				dCov: 0.2,
				ageingExponent: 0.4,
				tRefYears: 28 / 365.25
			}
		});
		const model = toDurabilityModel(parsed.XD3);
		expect(model.kind === 'chloride' && model.chloride.ageingExponent).toBe(0.4);
		expect(model.kind === 'chloride' && model.chloride.tRefYears).toBeCloseTo(28 / 365.25, 12);
		const constant = toDurabilityModel(defaultParameters('XD3')!);
		expect(constant.kind === 'chloride' && constant.chloride.ageingExponent).toBe(0);
	});
	it('fills in defaults only for the classes given, keeping what was entered', () => {
		const entered = { XC3: { kind: 'carbonation' as const, kMmPerSqrtYear: 2.5, depthCov: 0.1 } };
		const filled = withDefaults(['XC3', 'XD3', 'XF1'], entered);
		expect(Object.keys(filled)).toEqual(['XC3', 'XD3']);
		expect(filled.XC3).toEqual(entered.XC3);
	});
	it('refuses chloride contents that do not rise from initial to surface', () => {
		const parsed = durabilityParametersSchema.safeParse({
			XD1: {
				kind: 'chloride',
				surfaceContent: 0.5,
				initialContent: 0.1,
				criticalContent: 0.6,
				dM2PerS: 1e-12,
				dCov: 0.2
			}
		});
		expect(parsed.success).toBe(false);
	});
});

describe('areas and curve ages', () => {
	it('adds the members’ grid extents in m², unknown if one is missing', () => {
		expect(areaOfMembersM2([{ gridWidthMm: 7200, gridHeightMm: 7200 }])).toBeCloseTo(51.84, 10);
		expect(areaOfMembersM2([{ gridWidthMm: 7200, gridHeightMm: null }])).toBeNull();
	});
	it('runs the curve past the design life', () => {
		expect(curveAges(50).at(-1)).toBe(100);
		expect(curveAges(120).at(-1)).toBe(140);
	});
});
