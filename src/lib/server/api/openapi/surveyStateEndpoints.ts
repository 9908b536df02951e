import { reviewSchema } from '$lib/intake/schemas';
import { surveyAnswerSchema } from '../intakeAnswers';
import { jsonAnswer, recordParams, type Endpoint } from './endpoint';
import { READ_ONLY } from './errors';

/** The survey's states: these come last, since a submitted survey's records are frozen. */
export const surveyStateEndpoints: Endpoint[] = [
	{
		method: 'post',
		path: '/api/v1/surveys/{surveyId}/submit',
		operationId: 'submitSurvey',
		tag: 'Intake',
		summary: 'Hand a draft or returned survey to review; its records freeze',
		action: 'survey:submit',
		params: recordParams('survey'),
		response: jsonAnswer(surveyAnswerSchema, 'The survey, submitted.'),
		errors: { '403': READ_ONLY, '409': 'The survey is not a draft or returned one.' }
	},
	{
		method: 'post',
		path: '/api/v1/surveys/{surveyId}/review',
		operationId: 'reviewSurvey',
		tag: 'Intake',
		summary: 'Approve a submitted survey, or return it with what must change',
		action: 'survey:review',
		params: recordParams('survey'),
		body: reviewSchema,
		exampleBody: { decision: 'approve' },
		response: jsonAnswer(surveyAnswerSchema, 'The survey, approved or returned.'),
		errors: { '403': READ_ONLY, '409': 'The survey is not submitted.' }
	}
];
