import type { Sequelize } from 'sequelize';

export interface DatabaseHealth {
	up: boolean;
	latencyMs: number;
	reason?: string;
}

/** Asks the database a trivial question with a short deadline; never throws. */
export async function checkDatabase(
	sequelize: Sequelize,
	timeoutMs = 2_000
): Promise<DatabaseHealth> {
	const started = performance.now();
	let timer: NodeJS.Timeout | undefined;
	try {
		const deadline = new Promise<never>((_, reject) => {
			timer = setTimeout(() => reject(new Error(`no answer within ${timeoutMs} ms`)), timeoutMs);
		});
		await Promise.race([sequelize.query('SELECT 1', { plain: true, raw: true }), deadline]);
		return { up: true, latencyMs: Math.round(performance.now() - started) };
	} catch (err) {
		return {
			up: false,
			latencyMs: Math.round(performance.now() - started),
			reason: describeDatabaseError(err)
		};
	} finally {
		clearTimeout(timer);
	}
}

/** A short, safe description of a connection problem: no credentials, no SQL text. */
export function describeDatabaseError(err: unknown): string {
	const code = (err as { parent?: { code?: string }; original?: { code?: string } })?.parent?.code;
	const message = err instanceof Error ? err.message : String(err);
	if (code === 'ECONNREFUSED' || /ECONNREFUSED/.test(message))
		return 'the database refuses connections';
	if (/timeout|no answer/i.test(message)) return 'the database did not answer in time';
	if (/Access denied/i.test(message)) return 'the database refused our credentials';
	return 'the database is unavailable';
}
