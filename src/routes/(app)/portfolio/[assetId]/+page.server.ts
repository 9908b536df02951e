import { fail, redirect } from '@sveltejs/kit';
import { z } from 'zod';
import type { Actions, PageServerLoad } from './$types';
import { parseForm } from '$lib/server/web/forms';
import { pageActor } from '$lib/server/web/guard';
import { authorize } from '$lib/server/web/actor';
import { can } from '$lib/server/policy';
import { linksOf, revokeLink, shareReport, shareSchema } from '$lib/server/reports';
import { assetView, toRiskView } from '$lib/server/risk';
import { calibrationOwnerWords, customPopulationWords } from '$lib/words';
import { loadOr404 } from '$lib/server/web/pages';
import { pathId } from '$lib/server/web/params';

/** The form's record ids (fields, not the path: a bad one is a 400 naming the field). */
const idSchema = z.coerce.number().int().positive().max(4_294_967_295);

export const load: PageServerLoad = async (event) => {
	const actor = pageActor(event, 'report:read');
	const { asset, own, latest } = await loadOr404(() =>
		assetView(actor, pathId(event.params.assetId))
	);
	// Only the owning organisation's engineers send links; a shared viewer cannot.
	const mayShare = own && can(actor.role, 'report:share') && latest !== null;
	const links = mayShare && latest ? await loadOr404(() => linksOf(actor, latest.header.id)) : [];
	return {
		asset,
		view: latest ? toRiskView(latest) : null,
		lowAreas: latest?.snapshot.lowAreas?.flatMap((p) => p.members) ?? null,
		/** The populations the engineer made and the assessment carries, one sentence each. */
		custom: (latest?.snapshot.custom ?? []).map(customPopulationWords),
		/** Each population's check against the drilled holes, when the assessment carries it. */
		calibration:
			latest?.snapshot.calibration === 'apply'
				? latest.snapshot.populations.flatMap((p) =>
						p.calibration
							? [calibrationOwnerWords({ label: p.label, calibration: p.calibration })]
							: []
					)
				: [],
		mayShare,
		links: links.map((l) => ({
			id: l.id,
			recipientEmail: l.recipientEmail,
			expiresAt: l.expiresAt.toISOString(),
			revokedAt: l.revokedAt ? new Date(l.revokedAt).toISOString() : null,
			lastOpenedAt: l.lastOpenedAt ? new Date(l.lastOpenedAt).toISOString() : null
		}))
	};
};

const assessmentField = z.object({ assessment: idSchema });

export const actions = {
	share: async ({ locals, params, request }) => {
		const actor = authorize(locals, 'report:share');
		const parsed = await parseForm(request, shareSchema.extend(assessmentField.shape));
		if (!parsed.ok) return parsed.failure;
		await loadOr404(() => shareReport(actor, parsed.data.assessment, parsed.data));
		redirect(303, `/portfolio/${pathId(params.assetId)}?shared=1`);
	},
	revoke: async ({ locals, params, request }) => {
		const actor = authorize(locals, 'report:share');
		const parsed = await parseForm(request, assessmentField.extend({ link: idSchema }));
		if (!parsed.ok) return fail(400, { errors: { link: 'No such link.' }, values: {} });
		await loadOr404(() => revokeLink(actor, parsed.data.assessment, parsed.data.link));
		redirect(303, `/portfolio/${pathId(params.assetId)}?revoked=1`);
	}
} satisfies Actions;
