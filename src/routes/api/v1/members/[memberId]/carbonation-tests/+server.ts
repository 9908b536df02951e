import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { authorize } from '$lib/server/web/actor';
import { readJson } from '$lib/server/web/http';
import { carbonationTestSchema } from '$lib/intake/measurements';
import { createCarbonationTest, listCarbonationTests } from '$lib/server/intake/carbonation';
import { api } from '$lib/server/web/respond';
import { pathId } from '$lib/server/web/params';

export const GET: RequestHandler = async ({ locals, params }) => {
	const actor = authorize(locals, 'survey:read');
	const id = pathId(params.memberId);
	return json({ carbonationTests: await api(() => listCarbonationTests(actor, id)) });
};

export const POST: RequestHandler = async ({ locals, params, request }) => {
	const actor = authorize(locals, 'measurement:write');
	const id = pathId(params.memberId);
	const input = await readJson(request, carbonationTestSchema);
	const carbonationTest = await api(() => createCarbonationTest(actor, id, input));
	return json({ carbonationTest }, { status: 201 });
};
