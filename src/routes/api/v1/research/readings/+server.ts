import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { authorize } from '$lib/server/policy';
import { pageQuerySchema } from '$lib/server/api/cursor';
import { parseInput } from '$lib/server/api/request';
import { researchContext } from '$lib/server/research/context';
import { researchReadingPage } from '$lib/server/research/pages';
import { filterOf } from '$lib/server/research/requests';

export const GET: RequestHandler = async ({ locals, url }) => {
	authorize(locals, 'research:read');
	const filter = filterOf(url);
	const page = parseInput(pageQuerySchema, {
		cursor: url.searchParams.get('cursor') ?? undefined,
		limit: url.searchParams.get('limit') ?? undefined
	});
	const { sequelize, idSecret } = researchContext();
	return json(await researchReadingPage(sequelize, idSecret, filter, page.cursor ?? 0, page.limit));
};
