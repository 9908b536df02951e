import type { Survey } from '../db/models';
import { StateError } from '../domainErrors';

/** A submitted or approved survey's readings, members and holes are frozen. */
export function assertSurveyEditable(survey: Pick<Survey, 'status'>): void {
	if (survey.status === 'submitted' || survey.status === 'approved') {
		const next = survey.status === 'submitted' ? ' An engineer can return it for changes.' : '';
		throw new StateError(`The survey is ${survey.status}: its readings are frozen.${next}`);
	}
}
