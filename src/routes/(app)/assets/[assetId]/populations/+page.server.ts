import type { PageServerLoad } from './$types';
import { pageActor } from '$lib/server/web/guard';
import { Survey } from '$lib/server/db';
import { can } from '$lib/server/policy';
import { visibleAsset } from '$lib/server/populations';
import { pathId } from '$lib/server/web/params';

/** The frame of the overview; the table itself is fetched from the API by the browser. */
export const load: PageServerLoad = async (event) => {
	const actor = pageActor(event, 'population:read');
	const { asset, access } = await visibleAsset(actor, pathId(event.params.assetId));
	const surveys = await Survey.findAll({
		attributes: ['id', 'title', 'surveyDate', 'status'],
		where: { assetId: asset.id },
		order: [['surveyDate', 'ASC']],
		raw: true
	});
	return {
		asset: { id: asset.id, name: asset.name },
		surveys,
		canAssess: access === 'own' && can(actor.role, 'assessment:write'),
		canReadAssessments: can(actor.role, 'assessment:read')
	};
};
