/**
 * Why a survey's records cannot be changed, in the words every page and the service use, and
 * what would unfreeze them named for the person reading. Browser-safe: pages import it too.
 */
export type FrozenState = 'submitted' | 'approved';

export function isFrozen(status: string): status is FrozenState {
	return status === 'submitted' || status === 'approved';
}

/**
 * The explanation, or null while the survey may be changed. `mayReturn`: whether the reader's
 * role may return a submitted survey (policy "survey:review"); left out, the words name the
 * engineer who can.
 */
export function frozenWords(status: string, mayReturn?: boolean): string | null {
	if (!isFrozen(status)) return null;
	const head = `The survey is ${status}: its readings are frozen.`;
	if (mayReturn === undefined) {
		return status === 'submitted' ? `${head} An engineer can return it for changes.` : head;
	}
	const withThem = 'Members and holes are frozen with them.';
	if (status === 'approved') {
		return `${head} ${withThem} An approved survey stays as it is: record further readings in a new survey of this asset.`;
	}
	return mayReturn
		? `${head} ${withThem} To change them, return the survey to the surveyor with "Return to surveyor" on the survey page.`
		: `${head} ${withThem} To change them, ask an engineer of your organisation to return the survey for changes.`;
}

/** Why "Submit for review" is not offered, or refused, on a survey without readings. */
export const EMPTY_SURVEY_WORDS =
	'The survey has no readings yet: enter or import readings before submitting it for review.';
