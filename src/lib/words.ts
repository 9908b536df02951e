/**
 * Words the pages and the report both print, written once so the two never speak differently.
 * Browser-safe: no server imports.
 */
import type { RuleOutcome } from '$lib/analysis';

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
