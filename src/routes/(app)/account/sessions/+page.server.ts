import { error, redirect } from '@sveltejs/kit';
import { z } from 'zod';
import type { Actions, PageServerLoad } from './$types';
import { pageActor } from '$lib/server/web/guard';
import { authorize } from '$lib/server/web/actor';
import { endDevice, listDevices } from '$lib/server/auth/devices';

export const load: PageServerLoad = async (event) => {
	const actor = pageActor(event, 'account:manage');
	return { devices: await listDevices(actor.userId, event.locals.session?.id ?? null) };
};

const endSchema = z.object({ handle: z.string().regex(/^[0-9a-f]{24}$/) });

export const actions = {
	end: async ({ locals, request }) => {
		const actor = authorize(locals, 'account:manage');
		const parsed = endSchema.safeParse(Object.fromEntries(await request.formData()));
		// Someone else's session, or none: not found, whatever the reason.
		if (!parsed.success || !(await endDevice(actor.userId, parsed.data.handle))) {
			error(404, 'No such session.');
		}
		redirect(303, '/account/sessions');
	}
} satisfies Actions;
