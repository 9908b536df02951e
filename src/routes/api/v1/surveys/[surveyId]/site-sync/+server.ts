import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { authorize } from '$lib/server/web/actor';
import { readJson } from '$lib/server/web/http';
import { siteBatchSchema } from '$lib/intake/schemas';
import { receiveSiteBatch } from '$lib/server/intake/siteSync';
import { api } from '$lib/server/web/respond';
import { pathId } from '$lib/server/web/params';

/** A device's queued site entries: 201 when written now, 200 when this batch id already was. */
export const POST: RequestHandler = async ({ locals, params, request }) => {
	const actor = authorize(locals, 'reading:edit');
	const surveyId = pathId(params.surveyId);
	const batch = await readJson(request, siteBatchSchema);
	const answer = await api(() => receiveSiteBatch(actor, surveyId, batch));
	return json(answer, { status: answer.received === 'now' ? 201 : 200 });
};
