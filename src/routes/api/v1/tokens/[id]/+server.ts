import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { authorize } from '$lib/server/web/actor';
import { apiError } from '$lib/server/web/http';
import { pathId } from '$lib/server/web/params';
import { revokeTokenOf } from '$lib/server/auth/tokenActions';
import { clientAddress } from '$lib/server/web/signIn';

/** Revokes one of the caller's tokens; anyone else's is "not found", never "forbidden". */
export const DELETE: RequestHandler = async (event) => {
	const actor = authorize(event.locals, 'token:manage');
	const revoked = await revokeTokenOf(actor, pathId(event.params.id), clientAddress(event));
	if (!revoked) apiError(404, 'not_found', 'No such token.');
	return json({ token: revoked });
};
