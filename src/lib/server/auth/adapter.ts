import { Op } from 'sequelize';
import { Session, User } from '../db/models';
import { hashSecret } from './secrets';

/**
 * The key a session is stored under: the sha256 of the cookie's value, so that someone who
 * reads the sessions table (a backup, a replica) cannot use its rows as cookies.
 */
export function storedSessionId(sessionId: string): string {
	return hashSecret(sessionId);
}

/** A stored session in the shape the session layer (session.ts) reads. */
export interface DatabaseSession {
	id: string;
	userId: number;
	expiresAt: Date;
	attributes: { userAgent: string | null; ipAddress: string | null };
}

/** A session's user in the shape the session layer reads. */
export interface DatabaseUser {
	id: number;
	attributes: { email: string; displayName: string };
}

/**
 * Session storage over our own Sequelize models, for the session layer in session.ts (which
 * hands it to lucia; the types here are our own, so replacing lucia leaves this file as it is).
 * Sessions live in MariaDB, so several app processes can share them. The session layer hands
 * us the cookie's value; we hash it on the way in and never store it.
 */
export class SequelizeSessionAdapter {
	async getSessionAndUser(
		sessionId: string
	): Promise<[session: DatabaseSession | null, user: DatabaseUser | null]> {
		// From the primary: a session written a moment ago by another app process must be seen at
		// once, before a replica has caught up (read-your-own-writes; docs/scaling.md).
		const row = await Session.findByPk(storedSessionId(sessionId), {
			include: [User],
			useMaster: true
		});
		if (!row) return [null, null];
		const user = (row as Session & { User?: User }).User ?? null;
		// The session layer compares and refreshes by the id it was given, so hand back the cookie's value.
		return [{ ...toDatabaseSession(row), id: sessionId }, user ? toDatabaseUser(user) : null];
	}

	/** Ids here are the stored hashes: the session layer only lists them, we never turn them into cookies. */
	async getUserSessions(userId: number): Promise<DatabaseSession[]> {
		const rows = await Session.findAll({ where: { userId } });
		return rows.map(toDatabaseSession);
	}

	async setSession(session: DatabaseSession): Promise<void> {
		await Session.create({
			id: storedSessionId(session.id),
			userId: session.userId,
			expiresAt: session.expiresAt,
			userAgent: session.attributes.userAgent,
			ipAddress: session.attributes.ipAddress,
			createdAt: new Date()
		});
	}

	async updateSessionExpiration(sessionId: string, expiresAt: Date): Promise<void> {
		await Session.update({ expiresAt }, { where: { id: storedSessionId(sessionId) } });
	}

	async deleteSession(sessionId: string): Promise<void> {
		await Session.destroy({ where: { id: storedSessionId(sessionId) } });
	}

	async deleteUserSessions(userId: number): Promise<void> {
		await Session.destroy({ where: { userId } });
	}

	async deleteExpiredSessions(): Promise<void> {
		await Session.destroy({ where: { expiresAt: { [Op.lte]: new Date() } } });
	}
}

function toDatabaseSession(row: Session): DatabaseSession {
	return {
		id: row.id,
		userId: row.userId,
		expiresAt: row.expiresAt,
		attributes: { userAgent: row.userAgent, ipAddress: row.ipAddress }
	};
}

function toDatabaseUser(user: User): DatabaseUser {
	return {
		id: user.id,
		attributes: { email: user.email, displayName: user.displayName }
	};
}
