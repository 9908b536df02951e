import { json } from '@sveltejs/kit';
import { z } from 'zod';
import type { RequestHandler } from './$types';
import { authorize } from '$lib/server/policy';
import { parseInput } from '$lib/server/api/request';
import { idParam } from '$lib/server/api/schemas';
import { visibleSurvey } from '$lib/server/api/visible';
import { membersOf } from '$lib/server/api/ownRecords';

export const GET: RequestHandler = async ({ locals, params }) => {
	const actor = authorize(locals, 'asset:read');
	const { surveyId } = parseInput(z.object({ surveyId: idParam('survey') }), params);
	const survey = await visibleSurvey(actor, surveyId);
	return json({ members: await membersOf(survey.id) });
};
