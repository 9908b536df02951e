import { RISK_WORDS, type RiskLevel } from '$lib/words';
import { roundedPercent } from '$lib/format';

/**
 * Risk levels (their words are in $lib/words), each with a one-sentence reason. The level is
 * carried by its words (and an order), never by colour alone; pages may add a colour beside.
 */
export { RISK_WORDS, type RiskLevel };

/** Higher is worse; used to rank. */
export const RISK_SEVERITY: Record<RiskLevel, number> = {
	'act-now': 4,
	'plan-repairs': 3,
	'keep-watching': 2,
	'low-concern': 1,
	'not-judged': 0
};

export interface LevelInput {
	/** null when the population had too few readings to judge. */
	shareBelowCMin: number | null;
	cMinMm: number | null;
	verdict: 'pass' | 'fail' | 'not-enough-data' | null;
	designLifeYears: number;
	ageAtSurveyYears: number | null;
	/** Model probability of depassivation at the survey age and at the design life; null: no model. */
	probabilityNow: number | null;
	meetsTargetNow: boolean | null;
	probabilityAtDesignLife: number | null;
	meetsTargetAtDesignLife: boolean | null;
	/** First age on the curve at which the target is missed; null if never within the curve. */
	firstAgeMissingTarget: number | null;
}

function belowMinimumLevel(input: LevelInput): { level: RiskLevel; reason: string } {
	const share = input.shareBelowCMin ?? 0;
	if (input.verdict === 'pass') {
		return {
			level: 'low-concern',
			reason: `The cover meets the rules, and ${input.probabilityAtDesignLife === null ? 'no corrosion model applies to this exposure' : `protection is projected to hold through the design life of ${input.designLifeYears} years`}.`
		};
	}
	return {
		level: 'keep-watching',
		reason: `Protection is projected to hold through the design life, but ${roundedPercent(share)} of readings are below the minimum cover of ${input.cMinMm} mm.`
	};
}

/** The level of one population and the reason, in one sentence. */
export function riskLevel(input: LevelInput): { level: RiskLevel; reason: string } {
	if (input.verdict === null || input.shareBelowCMin === null) {
		return { level: 'not-judged', reason: 'Too few readings to judge this part.' };
	}
	if (input.meetsTargetNow === false && input.probabilityNow !== null) {
		return {
			level: 'act-now',
			reason: `About ${roundedPercent(input.probabilityNow)} of this part is projected to have lost its protection against corrosion already, at ${input.ageAtSurveyYears} years of age.`
		};
	}
	if (input.meetsTargetAtDesignLife === false) {
		const when = input.firstAgeMissingTarget;
		return {
			level: 'plan-repairs',
			reason: `Protection is projected to fall below the target ${when === null ? 'before' : `at about ${when} years of age, before`} the design life of ${input.designLifeYears} years ends.`
		};
	}
	return belowMinimumLevel(input);
}
