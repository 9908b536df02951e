import type { PageServerLoad } from './$types';
import { pageActor } from '$lib/server/web/guard';
import { can } from '$lib/server/policy';
import { filterOptions } from '$lib/server/research/options';

/** The explorer's frame: who may see it and which filter values exist. Figures come from the API. */
export const load: PageServerLoad = async (event) => {
	const actor = pageActor(event, 'research:read');
	return {
		options: await filterOptions(),
		mayExport: can(actor.role, 'research:export')
	};
};
