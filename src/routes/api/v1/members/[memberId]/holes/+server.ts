import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { authorize } from '$lib/server/web/actor';
import { readJson } from '$lib/server/web/http';
import { holeSchema } from '$lib/intake/schemas';
import { createHole, listHoles } from '$lib/server/intake/holes';
import { api } from '$lib/server/web/respond';
import { pathId } from '$lib/server/web/params';

export const GET: RequestHandler = async ({ locals, params }) => {
	const actor = authorize(locals, 'survey:read');
	return json({ holes: await api(() => listHoles(actor, pathId(params.memberId))) });
};

export const POST: RequestHandler = async ({ locals, params, request }) => {
	const actor = authorize(locals, 'hole:write');
	const id = pathId(params.memberId);
	const input = await readJson(request, holeSchema);
	return json({ hole: await api(() => createHole(actor, id, input)) }, { status: 201 });
};
