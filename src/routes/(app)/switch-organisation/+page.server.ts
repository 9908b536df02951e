import { error, redirect } from '@sveltejs/kit';
import { z } from 'zod';
import type { Actions, PageServerLoad } from './$types';
import { switchOrganisation } from '$lib/server/auth/membership';
import { requireActor } from '$lib/server/web/actor';

export const load: PageServerLoad = async () => redirect(303, '/dashboard');

const switchSchema = z.object({ organisationId: z.coerce.number().int().positive() });

export const actions = {
	default: async ({ locals, request }) => {
		const actor = requireActor(locals);
		const parsed = switchSchema.safeParse(Object.fromEntries(await request.formData()));
		if (!parsed.success) error(400, 'Choose an organisation.');
		const { organisationId } = parsed.data;
		// Not a member there: the same 404 as for anything else of another organisation.
		if (!(await switchOrganisation(actor.userId, organisationId))) error(404, 'Not found.');
		redirect(303, '/dashboard');
	}
} satisfies Actions;
