import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { databaseHealth } from '$lib/server/health';

/**
 * Liveness and the database's state: 200 when it answers, 503 with a reason when it does not.
 * The 503 carries the /api error shape too (`error: { code, message }`) beside the report.
 */
export const GET: RequestHandler = async () => {
	const database = await databaseHealth();
	const report = {
		status: database.up ? 'ok' : 'degraded',
		database,
		checkedAt: new Date().toISOString()
	};
	const body = database.up
		? report
		: {
				...report,
				error: {
					code: 'unavailable',
					message: `Fractile cannot reach its database: ${database.reason}.`
				}
			};
	return json(body, { status: database.up ? 200 : 503, headers: { 'cache-control': 'no-store' } });
};
