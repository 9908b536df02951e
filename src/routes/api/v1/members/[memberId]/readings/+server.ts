import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { authorize } from '$lib/server/web/actor';
import { pageQuerySchema } from '$lib/server/api/cursor';
import { queryObject, readQuery } from '$lib/server/web/query';
import { scopedMember } from '$lib/server/access';
import { readingPage } from '$lib/server/api/ownRecords';
import { apiError, readJson } from '$lib/server/web/http';
import { manualEntrySchema } from '$lib/intake/schemas';
import { saveManualReadings } from '$lib/server/intake/manualEntry';
import { api } from '$lib/server/web/respond';
import { pathId } from '$lib/server/web/params';

export const GET: RequestHandler = async ({ locals, params, url }) => {
	const actor = authorize(locals, 'survey:read');
	const memberId = pathId(params.memberId);
	const { cursor, limit } = readQuery(pageQuerySchema, queryObject(url));
	const { member } = await api(() => scopedMember(actor, memberId, 'read'));
	return json(await readingPage(member.id, cursor?.after ?? 0, limit));
};

export const POST: RequestHandler = async ({ locals, params, request }) => {
	const actor = authorize(locals, 'reading:edit');
	const id = pathId(params.memberId);
	const entry = await readJson(request, manualEntrySchema);
	const outcome = await api(() => saveManualReadings(actor, id, entry));
	if (outcome.state !== 'completed') apiError(400, 'rows-rejected', outcome.message);
	return json(outcome, { status: 201 });
};
