import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { authorize } from '$lib/server/web/actor';
import { pageQuerySchema } from '$lib/server/api/cursor';
import { readQuery } from '$lib/server/web/query';
import { researchContext } from '$lib/server/research/context';
import { researchReadingPage } from '$lib/server/research/pages';
import { filterOf } from '$lib/server/web/researchQuery';
import { START } from '$lib/server/research/readings';

export const GET: RequestHandler = async ({ locals, url }) => {
	authorize(locals, 'research:read');
	const filter = filterOf(url);
	const page = readQuery(pageQuerySchema, {
		cursor: url.searchParams.get('cursor') ?? undefined,
		limit: url.searchParams.get('limit') ?? undefined
	});
	const { sequelize, idSecret } = researchContext();
	const after = page.cursor ? { memberId: page.cursor.member, id: page.cursor.after } : START;
	return json(await researchReadingPage(sequelize, idSecret, filter, after, page.limit));
};
