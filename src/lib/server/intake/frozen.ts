import type { Transaction } from 'sequelize';
import type { Survey } from '../db/models';
import { StateError } from '../domainErrors';
import { frozenWords } from '$lib/intake/frozen';

/**
 * Why a survey may not be changed, or null: a submitted or approved survey is frozen. Pages
 * pass whether the reader may return it, so the way to unfreeze is named for them.
 */
export function frozenReason(survey: Pick<Survey, 'status'>, mayReturn?: boolean): string | null {
	return frozenWords(survey.status, mayReturn);
}

/** A submitted or approved survey's readings, members and holes are frozen. */
export function assertSurveyEditable(survey: Pick<Survey, 'status'>): void {
	const reason = frozenReason(survey);
	if (reason) throw new StateError(reason);
}

/**
 * The same check inside the writer's transaction, on the survey row read again under a lock:
 * a submit (which takes the row FOR UPDATE) either waits for this change or is seen by it, so
 * no edit lands on a survey that was frozen between the page's check and the write.
 */
export async function assertSurveyEditableLocked(
	survey: Survey,
	transaction: Transaction
): Promise<void> {
	await survey.reload({ transaction, lock: transaction.LOCK.UPDATE });
	assertSurveyEditable(survey);
}
