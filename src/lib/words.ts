/**
 * Words the pages and the report both print, written once so the two never speak differently.
 * Browser-safe: no server imports.
 */
import type { RuleOutcome } from '$lib/analysis';
import { counted } from './format';

/** A rule's or population's verdict as people read it. */
export const VERDICT_WORDS: Record<RuleOutcome, string> = {
	pass: 'Complies',
	fail: 'Does not comply',
	'not-enough-data': 'Too few readings'
};

export const NOT_JUDGED = 'Not judged';

export const verdictWords = (outcome: RuleOutcome | null | undefined): string =>
	outcome ? (VERDICT_WORDS[outcome] ?? NOT_JUDGED) : NOT_JUDGED;

/** A survey's state as people read it. */
export const SURVEY_STATE_WORDS: Record<string, string> = {
	draft: 'draft (still being entered)',
	submitted: 'submitted, not yet approved',
	approved: 'approved',
	returned: 'returned to the surveyor for changes'
};

export const surveyStateWords = (state: string): string => SURVEY_STATE_WORDS[state] ?? state;

// Figures and dates are formatted in format.ts (re-exported here for the word lists' callers).
export { counted, formatDate, formatDateTime } from './format';

/** What "depassivated" means, for an owner who is not a corrosion engineer (pages and report). */
export const DEPASSIVATED_WORDS =
	'“Without protection” (depassivated) means the concrete around the steel no longer keeps it from corroding: carbonation or chlorides have reached the bar. Corrosion can start from then on; it is not yet damage.';

const COUNT_WORDS = ['no', 'one', 'two', 'three', 'four', 'five', 'six', 'seven', 'eight', 'nine'];
/** counted() with small numbers in words, for sentences ("two areas"). */
const countWords = (n: number, one: string, many: string) =>
	counted(n, one, many).replace(/^\d+/, (digits) => COUNT_WORDS[n] ?? digits);

/** A member's low-cover areas as the owner's page and the report give them. */
export interface LowAreaSummary {
	memberLabel: string;
	populationLabel: string;
	areaCount: number;
	areaM2: number;
}

/**
 * "Treat first: member L2-BAY-07 (deck · XD3), two areas, 14 m²": the member with the most area
 * below c_min; null when no member has any.
 */
export function treatFirstWords(members: readonly LowAreaSummary[]): string | null {
	const first = [...members].sort((a, b) => b.areaM2 - a.areaM2)[0];
	if (!first || first.areaCount === 0) return null;
	const m2 = first.areaM2 >= 10 ? first.areaM2.toFixed(0) : first.areaM2.toFixed(1);
	const others = members.filter((m) => m !== first && m.areaCount > 0).length;
	const rest =
		others > 0 ? `; ${countWords(others, 'other member has', 'other members have')} low areas` : '';
	return (
		`Treat first: member ${first.memberLabel} (${first.populationLabel}), ` +
		`${countWords(first.areaCount, 'area', 'areas')} below c_min, ${m2} m²${rest}.`
	);
}

/** The rule sets (src/lib/analysis/rules/ruleSets.ts) as people read them; the key stays in URLs. */
export const RULE_SET_WORDS: Record<string, string> = {
	'en-statistical': 'statistical acceptance: characteristic cover, share below c_min, excess cover',
	'aci-tolerance': 'tolerance on each reading (ACI 117), excess cover',
	'strict-minimum': 'no reading below c_min, excess cover',
	'full-review': 'every rule, for a review'
};

export const ruleSetWords = (name: string): string => RULE_SET_WORDS[name] ?? name;
