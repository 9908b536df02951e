import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { authorize } from '$lib/server/web/actor';
import { researchContext } from '$lib/server/research/context';
import { statisticsQueryOf } from '$lib/server/web/researchQuery';
import { researchStatistics } from '$lib/server/research/statistics';

export const GET: RequestHandler = async ({ locals, url }) => {
	authorize(locals, 'research:read');
	const { groupBy, charts, ...filter } = statisticsQueryOf(url);
	const { sequelize } = researchContext();
	return json(await researchStatistics(sequelize, filter, { groupBy, charts }));
};
