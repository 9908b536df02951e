import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { authorize } from '$lib/server/web/actor';
import { pathId } from '$lib/server/web/params';
import { api } from '$lib/server/web/respond';
import { dataDictionary, exportReadme } from '$lib/server/research/dictionary';
import { exportOf } from '$lib/server/research/exportRecord';

/** An export's manifest: what was asked, how many rows, the README and the data dictionary. */
export const GET: RequestHandler = async ({ locals, params }) => {
	const actor = authorize(locals, 'research:export');
	const exportId = pathId(params.exportId);
	const summary = await api(() => exportOf(actor.organisationId, exportId));
	const day = summary.createdAt.slice(0, 10);
	const readme = exportReadme(summary.id, day);
	return json({
		export: summary,
		citation: `Fractile research export ${summary.id} (engine ${summary.engineVersion}, ${day}).`,
		readme,
		dictionary: dataDictionary()
	});
};
