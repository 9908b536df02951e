import type { PageServerLoad } from './$types';
import { can } from '$lib/server/policy';
import { pageActor } from '$lib/server/web/guard';
import { listMembers } from '$lib/server/intake/members';
import { loadOr404 } from '$lib/server/web/pages';
import { pathId } from '$lib/server/web/params';
import { scopedSurvey } from '$lib/server/access';
import { plannedReadingsByMember } from '$lib/server/planning/service';

export const load: PageServerLoad = async (event) => {
	const actor = pageActor(event, 'survey:read');
	const surveyId = pathId(event.params.surveyId);
	const { survey, asset } = await loadOr404(() => scopedSurvey(actor, surveyId, 'read'));
	const own = asset.organisationId === actor.organisationId;
	const editable = own && (survey.status === 'draft' || survey.status === 'returned');
	// The survey's plan, when one is saved: each member's count shows "of N planned".
	const planned = (await plannedReadingsByMember(surveyId)).filter((row) => row.planned !== null);
	return {
		survey: { id: survey.id, title: survey.title, status: survey.status },
		/** Entries on the device are kept per person: only this user's are shown and sent. */
		userId: actor.userId,
		asset: { id: asset.id, name: asset.name, designCode: asset.designCode },
		members: await listMembers(actor, surveyId),
		/** Planned readings per member id from the survey's plan; null when no population is planned. */
		plannedReadingsByMember:
			planned.length > 0
				? (Object.fromEntries(
						planned.map((row) => [row.memberId, row.planned as number])
					) as Record<number, number>)
				: null,
		can: {
			enter: editable && can(actor.role, 'reading:edit'),
			holes: editable && can(actor.role, 'hole:write'),
			photos: editable && can(actor.role, 'attachment:upload')
		}
	};
};
