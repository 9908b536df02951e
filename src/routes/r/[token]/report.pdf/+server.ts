import type { RequestHandler } from './$types';
import { openLink, pdfResponse } from '$lib/server/reports';
import { loadOr404 } from '$lib/server/web/pages';
import { assessedSource } from '$lib/server/risk';

/** The shared report's PDF: no account, this report only; the open is audited. */
export const GET: RequestHandler = async ({ params, getClientAddress }) => {
	const { assessment } = await loadOr404(() => openLink(params.token, getClientAddress()));
	return pdfResponse(await assessedSource(assessment));
};
