import { Session } from '../db/models';
import { hashSecret } from './secrets';

/**
 * A signed-in device as the account page shows it. The session id is the cookie's secret, so
 * pages name a session by a handle derived from it, never by the id itself.
 */
export interface Device {
	handle: string;
	userAgent: string | null;
	ipAddress: string | null;
	createdAt: Date;
	expiresAt: Date;
	current: boolean;
}

export function sessionHandle(sessionId: string): string {
	return hashSecret(`session:${sessionId}`).slice(0, 24);
}

export async function listDevices(
	userId: number,
	currentSessionId: string | null
): Promise<Device[]> {
	const rows = await Session.findAll({ where: { userId }, order: [['createdAt', 'DESC']] });
	return rows.map((row) => ({
		handle: sessionHandle(row.id),
		userAgent: row.userAgent,
		ipAddress: row.ipAddress,
		createdAt: row.createdAt,
		expiresAt: row.expiresAt,
		current: row.id === currentSessionId
	}));
}

/** Ends one of the user's own sessions by its handle; false when there is none such. */
export async function endDevice(userId: number, handle: string): Promise<boolean> {
	const rows = await Session.findAll({ where: { userId }, attributes: ['id'] });
	const match = rows.find((row) => sessionHandle(row.id) === handle);
	if (!match) return false;
	await Session.destroy({ where: { id: match.id } });
	return true;
}
