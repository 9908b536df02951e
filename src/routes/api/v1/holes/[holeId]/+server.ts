import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { authorize } from '$lib/server/web/actor';
import { readJson } from '$lib/server/web/http';
import { holeSchema } from '$lib/intake/schemas';
import { deleteHole, updateHole } from '$lib/server/intake/holes';
import { scopedHole } from '$lib/server/access';
import { api } from '$lib/server/web/respond';
import { pathId } from '$lib/server/web/params';

export const GET: RequestHandler = async ({ locals, params }) => {
	const actor = authorize(locals, 'survey:read');
	const { hole } = await api(() => scopedHole(actor, pathId(params.holeId), 'read'));
	return json({ hole });
};

/** Corrects a hole of a draft or returned survey: the whole hole, as POST …/holes takes it. */
export const PUT: RequestHandler = async ({ locals, params, request }) => {
	const actor = authorize(locals, 'hole:write');
	const id = pathId(params.holeId);
	const input = await readJson(request, holeSchema);
	return json({ hole: await api(() => updateHole(actor, id, input)) });
};

export const DELETE: RequestHandler = async ({ locals, params }) => {
	const actor = authorize(locals, 'hole:write');
	const id = pathId(params.holeId);
	await api(() => deleteHole(actor, id));
	return new Response(null, { status: 204 });
};
