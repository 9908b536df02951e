import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { authorize } from '$lib/server/web/actor';
import { dataDictionary } from '$lib/server/research/dictionary';

export const GET: RequestHandler = async ({ locals }) => {
	authorize(locals, 'research:read');
	return json(dataDictionary());
};
