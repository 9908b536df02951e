import { error, redirect } from '@sveltejs/kit';
import { z } from 'zod';
import type { Actions, PageServerLoad } from './$types';
import { Asset } from '$lib/server/db';
import { parseForm } from '$lib/server/web/forms';
import { pageActor } from '$lib/server/web/guard';
import { authorize } from '$lib/server/web/actor';
import { AssetNotFoundError, setConsent } from '$lib/server/research/consent';

/** The owning organisation's consent, asset by asset, to anonymised research use. */
export const load: PageServerLoad = async (event) => {
	const actor = pageActor(event, 'research:consent');
	const assets = await Asset.findAll({
		where: { organisationId: actor.organisationId },
		order: [['name', 'ASC']]
	});
	return {
		assets: assets.map((a) => ({
			id: a.id,
			name: a.name,
			researchOptIn: Boolean(a.researchOptIn),
			changedAt: a.researchOptInChangedAt?.toISOString() ?? null
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
		try {
			await setConsent(actor, assetId, researchOptIn === 'true');
		} catch (e) {
			if (e instanceof AssetNotFoundError) error(404, e.message);
			throw e;
		}
		redirect(303, '/organisation/research-consent');
	}
} satisfies Actions;
