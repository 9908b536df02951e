import type { RequestHandler } from './$types';
import { authorize } from '$lib/server/web/actor';
import { siteSheetPdf } from '$lib/server/planning/siteSheet';
import { api } from '$lib/server/web/respond';
import { pathId } from '$lib/server/web/params';

/** The plan's site sheet: a grid per member to write readings in by hand. */
export const GET: RequestHandler = async ({ locals, params }) => {
	const actor = authorize(locals, 'survey:read');
	const id = pathId(params.surveyId);
	const pdf = await api(() => siteSheetPdf(actor, id));
	return new Response(new Uint8Array(pdf), {
		headers: {
			'content-type': 'application/pdf',
			'content-disposition': `attachment; filename="fractile-survey-${id}-site-sheet.pdf"`,
			'content-length': String(pdf.length),
			'cache-control': 'private, no-store'
		}
	});
};
