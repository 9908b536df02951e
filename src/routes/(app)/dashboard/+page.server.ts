import type { PageServerLoad } from './$types';
import { pageActor } from '$lib/server/guard';

export const load: PageServerLoad = async (event) => {
	const actor = pageActor(event, 'dashboard:read');
	return { role: actor.role };
};
