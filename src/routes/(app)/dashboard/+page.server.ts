import type { PageServerLoad } from './$types';
import { pageActor } from '$lib/server/web/guard';
import { can } from '$lib/server/policy';
import { dashboardFor } from '$lib/server/dashboard';

export const load: PageServerLoad = async (event) => {
	const actor = pageActor(event, 'dashboard:read');
	return {
		role: actor.role,
		showPopulations: can(actor.role, 'population:read'),
		showAssessments: can(actor.role, 'assessment:read'),
		...(await dashboardFor(actor))
	};
};
