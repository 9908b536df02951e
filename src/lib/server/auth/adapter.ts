import { Op } from 'sequelize';
import type { Adapter, DatabaseSession, DatabaseUser } from 'lucia';
import { Session, User } from '../db/models';

/**
 * Lucia's storage over our own Sequelize models (lucia v3 leaves storage to the app).
 * Sessions live in MariaDB, so several app processes can share them (issue 9).
 */
export class SequelizeSessionAdapter implements Adapter {
	async getSessionAndUser(
		sessionId: string
	): Promise<[session: DatabaseSession | null, user: DatabaseUser | null]> {
		// From the primary: a session written a moment ago by another app process must be seen at
		// once, before a replica has caught up (read-your-own-writes; docs/scaling.md).
		const row = await Session.findByPk(sessionId, { include: [User], useMaster: true });
		if (!row) return [null, null];
		const user = (row as Session & { User?: User }).User ?? null;
		return [toDatabaseSession(row), user ? toDatabaseUser(user) : null];
	}

	async getUserSessions(userId: number): Promise<DatabaseSession[]> {
		const rows = await Session.findAll({ where: { userId } });
		return rows.map(toDatabaseSession);
	}

	async setSession(session: DatabaseSession): Promise<void> {
		await Session.create({
			id: session.id,
			userId: session.userId,
			expiresAt: session.expiresAt,
			userAgent: session.attributes.userAgent,
			ipAddress: session.attributes.ipAddress,
			createdAt: new Date()
		});
	}

	async updateSessionExpiration(sessionId: string, expiresAt: Date): Promise<void> {
		await Session.update({ expiresAt }, { where: { id: sessionId } });
	}

	async deleteSession(sessionId: string): Promise<void> {
		await Session.destroy({ where: { id: sessionId } });
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
