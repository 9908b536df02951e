import type { PageServerLoad } from './$types';
import { openLink } from '$lib/server/reports';
import { loadOr404 } from '$lib/server/web/pages';
import { assessedSource, toRiskView } from '$lib/server/risk';

/** A shared report: no account needed, this report only; every open is an audit event. */
export const load: PageServerLoad = async ({ params, getClientAddress, setHeaders }) => {
	const { assessment, sharedBy, expiresAt } = await loadOr404(() =>
		openLink(params.token, getClientAddress())
	);
	const source = await assessedSource(assessment);
	setHeaders({ 'cache-control': 'private, no-store', 'referrer-policy': 'no-referrer' });
	return {
		assetName: source.snapshot.asset.name,
		organisation: source.header.organisation,
		sharedBy,
		expiresOn: expiresAt.toISOString().slice(0, 10),
		view: toRiskView(source)
	};
};
