import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { authorize } from '$lib/server/web/actor';
import { researchContext } from '$lib/server/research/context';
import { researchMembers } from '$lib/server/research/pages';
import { filterOf } from '$lib/server/web/researchQuery';

export const GET: RequestHandler = async ({ locals, url }) => {
	authorize(locals, 'research:read');
	const filter = filterOf(url);
	const { sequelize, idSecret } = researchContext();
	return json({ members: await researchMembers(sequelize, idSecret, filter) });
};
