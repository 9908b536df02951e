import { db } from './db';
import { checkDatabase, type DatabaseHealth } from './db/health';

/** The database's state for /api/health: asked with a short deadline; never throws. */
export function databaseHealth(): Promise<DatabaseHealth> {
	return checkDatabase(db());
}
