import { Session } from '../db/models';
import { hashSecret } from './secrets';
import { storedSessionId } from './adapter';

/**
 * A signed-in device as the account page shows it. Pages name a session by a short handle
 * derived from its stored key, never by the key itself.
 */
export interface Device {
	handle: string;
	userAgent: string | null;
	ipAddress: string | null;
	createdAt: Date;
	expiresAt: Date;
	current: boolean;
}

export function sessionHandle(storedId: string): string {
	return hashSecret(`session:${storedId}`).slice(0, 24);
}

export async function listDevices(
	userId: number,
	currentSessionId: string | null
): Promise<Device[]> {
	const rows = await Session.findAll({ where: { userId }, order: [['createdAt', 'DESC']] });
	const current = currentSessionId ? storedSessionId(currentSessionId) : null;
	return rows.map((row) => ({
		handle: sessionHandle(row.id),
		userAgent: row.userAgent,
		ipAddress: row.ipAddress,
		createdAt: row.createdAt,
		expiresAt: row.expiresAt,
		current: row.id === current
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
