import { json } from '@sveltejs/kit';
import { z } from 'zod';
import type { RequestHandler } from './$types';
import { authorize } from '$lib/server/web/actor';
import type { Actor } from '$lib/server/policy';
import { apiError, readJson } from '$lib/server/web/http';
import { roleSchema } from '$lib/server/auth/schemas';
import { pathId } from '$lib/server/web/params';
import { changeRole, LastAdminError, removeMember } from '$lib/server/organisation/members';

const patchSchema = z.object({ role: roleSchema });

/** Runs a change, turning "not ours" into 404 and "last admin" into 409. */
async function change<T>(run: () => Promise<T | null>): Promise<T> {
	try {
		const result = await run();
		if (!result) apiError(404, 'not_found', 'No such member.');
		return result;
	} catch (err) {
		if (err instanceof LastAdminError) apiError(409, 'last_admin', err.message);
		throw err;
	}
}

/** Changes a member's role: `{ "role": "engineer" }`. */
export const PATCH: RequestHandler = async ({ locals, params, request }) => {
	const actor: Actor = authorize(locals, 'organisation:manage');
	const id = pathId(params.id);
	const { role } = await readJson(request, patchSchema);
	const membership = await change(() => changeRole(actor, id, role));
	return json({ member: { id: membership.id, userId: membership.userId, role: membership.role } });
};

export const DELETE: RequestHandler = async ({ locals, params }) => {
	const actor = authorize(locals, 'organisation:manage');
	const id = pathId(params.id);
	await change(() => removeMember(actor, id));
	return new Response(null, { status: 204 });
};
