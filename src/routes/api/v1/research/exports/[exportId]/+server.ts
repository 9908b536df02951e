import { json } from '@sveltejs/kit';
import { z } from 'zod';
import type { RequestHandler } from './$types';
import { authorize } from '$lib/server/web/actor';
import { apiError } from '$lib/server/web/http';
import { ResearchExport } from '$lib/server/db';
import { parseInput } from '$lib/server/api/request';
import { idParam } from '$lib/server/api/schemas';
import { dataDictionary, exportReadme } from '$lib/server/research/dictionary';
import { summariseExport } from '$lib/server/research/exportRecord';

/** An export's manifest: what was asked, how many rows, the README and the data dictionary. */
export const GET: RequestHandler = async ({ locals, params }) => {
	const actor = authorize(locals, 'research:export');
	const { exportId } = parseInput(z.object({ exportId: idParam('export') }), params);
	const record = await ResearchExport.findOne({
		where: { id: exportId, organisationId: actor.organisationId }
	});
	if (!record) apiError(404, 'not_found', 'No such export in your organisation.');
	const summary = summariseExport(record);
	const day = summary.createdAt.slice(0, 10);
	const readme = exportReadme(summary.id, day);
	return json({
		export: summary,
		citation: `Fractile research export ${summary.id} (engine ${summary.engineVersion}, ${day}).`,
		readme,
		dictionary: dataDictionary()
	});
};
