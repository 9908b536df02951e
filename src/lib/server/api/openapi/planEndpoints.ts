import { z } from 'zod';
import { surveyPlanSchema } from '$lib/intake/plan';
import { surveyPlanAnswerSchema } from '../planAnswers';
import { jsonAnswer, recordParams, type Endpoint } from './endpoint';
import { FROZEN, READ_ONLY } from './errors';

const planBody = surveyPlanSchema.meta({ id: 'SurveyPlanInput' });

/** A small plan, so the example computes in well under a second. */
const examplePlan = {
	settings: { ruleSet: 'en-statistical', marginMm: 2, p0: 0.01, p1: 0.1, replicates: 40 },
	populations: [
		{ memberType: 'wall', exposureClass: 'XC3', memberCount: 2, cMinMm: 25, cNomMm: 35 }
	]
};

/**
 * The survey's plan (src/lib/server/planning): how many readings each planned population needs
 * for the penalty margin and for the rules to tell p0 from p1, the rules' operating
 * characteristic (each curve names its method), and the site sheet to write readings on.
 */
export const planEndpoints: Endpoint[] = [
	{
		method: 'put',
		path: '/api/v1/surveys/{surveyId}/plan',
		operationId: 'saveSurveyPlan',
		tag: 'Intake',
		summary:
			'Plan the survey: readings per population and member, with the operating characteristic',
		description:
			'A population left without sdMm takes the SD of its readings in the latest other survey of the asset, else the stated default of 8 mm; the answer says which (sdBasis). The whole rule set is simulated with the seed given, so the same plan gives the same figures.',
		action: 'survey:plan',
		params: recordParams('survey'),
		body: planBody,
		exampleBody: examplePlan,
		response: jsonAnswer(surveyPlanAnswerSchema, 'The plan as saved, with the measured counts.'),
		errors: { '403': READ_ONLY, '409': FROZEN }
	},
	{
		method: 'get',
		path: '/api/v1/surveys/{surveyId}/plan',
		operationId: 'getSurveyPlan',
		tag: 'Intake',
		summary: 'The survey plan, planned against measured per population and member',
		action: 'survey:read',
		params: recordParams('survey'),
		response: jsonAnswer(surveyPlanAnswerSchema, 'The plan; 404 when none is saved.')
	},
	{
		method: 'get',
		path: '/api/v1/surveys/{surveyId}/plan/site-sheet',
		operationId: 'getSurveySiteSheet',
		tag: 'Intake',
		summary: 'The site sheet (PDF): per member a numbered grid for the planned readings',
		action: 'survey:read',
		params: recordParams('survey'),
		response: { mediaType: 'application/pdf', description: 'A4 PDF.' },
		errors: { '409': 'The survey has no plan yet.' }
	},
	{
		method: 'delete',
		path: '/api/v1/surveys/{surveyId}/plan',
		operationId: 'deleteSurveyPlan',
		tag: 'Intake',
		summary: 'Remove the survey plan (audited); readings are untouched',
		action: 'survey:plan',
		params: recordParams('survey'),
		response: jsonAnswer(
			z.object({ deleted: z.boolean().describe('False when there was no plan.') }),
			'Whether a plan was removed.'
		),
		errors: { '403': READ_ONLY, '409': FROZEN }
	}
];
