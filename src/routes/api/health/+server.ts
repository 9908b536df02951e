import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { db } from '$lib/server/db';
import { checkDatabase } from '$lib/server/db/health';

/** Liveness and the database's state: 200 when it answers, 503 with a reason when it does not. */
export const GET: RequestHandler = async () => {
	const database = await checkDatabase(db());
	return json(
		{ status: database.up ? 'ok' : 'degraded', database, checkedAt: new Date().toISOString() },
		{ status: database.up ? 200 : 503, headers: { 'cache-control': 'no-store' } }
	);
};
