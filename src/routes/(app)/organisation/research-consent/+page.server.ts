import { redirect } from '@sveltejs/kit';
import { z } from 'zod';
import type { Actions, PageServerLoad } from './$types';
import { parseForm } from '$lib/server/web/forms';
import { pageActor } from '$lib/server/web/guard';
import { authorize } from '$lib/server/web/actor';
import { loadOr404 } from '$lib/server/web/pages';
import { consentList, setConsent } from '$lib/server/research/consent';

/** The owning organisation's consent, asset by asset, to anonymised research use. */
export const load: PageServerLoad = async (event) => {
	const actor = pageActor(event, 'research:consent');
	const assets = await consentList(actor);
	return {
		assets: assets.map((a) => ({
			id: a.assetId,
			name: a.name,
			researchOptIn: a.researchOptIn,
			changedAt: a.changedAt
		}))
	};
};

const consentForm = z.object({
	assetId: z.coerce.number('assetId must be a number').int().min(1),
	researchOptIn: z.enum(['true', 'false'], { error: 'researchOptIn must be true or false' })
});

export const actions = {
	default: async ({ locals, request }) => {
		const actor = authorize(locals, 'research:consent');
		const parsed = await parseForm(request, consentForm);
		if (!parsed.ok) return parsed.failure;
		const { assetId, researchOptIn } = parsed.data;
		await loadOr404(() => setConsent(actor, assetId, researchOptIn === 'true'));
		redirect(303, '/organisation/research-consent');
	}
} satisfies Actions;
