import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { authorize } from '$lib/server/web/actor';
import { readJson } from '$lib/server/web/http';
import { api } from '$lib/server/web/respond';
import { pathId } from '$lib/server/web/params';
import { consentBodySchema } from '$lib/server/research/apiSchemas';
import { readConsent, setConsent } from '$lib/server/research/consent';

/** The consent of an asset the caller's organisation owns (a shared one is not theirs to give). */
export const GET: RequestHandler = async ({ locals, params }) => {
	const actor = authorize(locals, 'research:consent');
	const assetId = pathId(params.assetId);
	return json(await api(() => readConsent(actor, assetId)));
};

export const PUT: RequestHandler = async ({ locals, params, request }) => {
	const actor = authorize(locals, 'research:consent');
	const assetId = pathId(params.assetId);
	const { researchOptIn } = await readJson(request, consentBodySchema);
	return json(await api(() => setConsent(actor, assetId, researchOptIn)));
};
