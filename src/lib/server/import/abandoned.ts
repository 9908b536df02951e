import { QueryTypes } from 'sequelize';
import { ImportBatch } from '../db/models';
import { recordAudit } from '../audit';
import { writesThroughSeveralNodes } from '../db/connection';
import { isDatabaseUnavailable } from '../db/unavailable';
import { IMPORT_LIMITS } from './limits';
import { removeStagedCopies } from './stagedCopies';

/** A running batch as the sweep sees it. */
export interface RunningImport {
	batchId: number;
	organisationId: number;
	/** The MariaDB connection its one transaction runs on (recorded at its first report). */
	connectionId: number | null;
	heartbeatAt: Date | null;
	rowsRead: number;
}

export const ABANDONED_MESSAGE =
	'The import stopped before it finished (the server handling it ended, or lost its database connection); nothing was written. Start it again.';

/**
 * Whether no process is behind a running import any more:
 * - its connection is gone from MariaDB. MariaDB rolls a connection's open transaction back
 *   before it drops the connection from its process list (sql/mysqld.cc, unlink_thd:
 *   THD::cleanup, which calls trans_rollback, runs before server_threads.erase), so nothing of
 *   the import was written and no process can commit it any more; or
 * - it has not reported for IMPORT_LIMITS.staleAfterMs. That covers a batch that died before
 *   recording its connection, and an id MariaDB gave a new connection after a restart. A live
 *   import reports about every 0.5 s, and each of its statements is bounded by the query timeout.
 */
export function isAbandoned(
	run: RunningImport,
	/** The open connections, or null when the process list cannot tell (see below). */
	openConnections: ReadonlySet<number> | null,
	nowMs: number
): boolean {
	if (openConnections && run.connectionId !== null && !openConnections.has(run.connectionId)) {
		return true;
	}
	return nowMs - (run.heartbeatAt?.getTime() ?? 0) > IMPORT_LIMITS.staleAfterMs;
}

const sequelize = () => ImportBatch.sequelize!;

/**
 * Running batches with their progress, from the primary (a replica may lag behind a batch's
 * end). A plain, non-locking read: an UPDATE scanning running batches would wait on the lock a
 * live import holds on its own batch row.
 */
async function runningImports(): Promise<RunningImport[]> {
	const rows = await sequelize().query<Record<keyof RunningImport, unknown>>(
		`SELECT b.id AS batchId, a.organisation_id AS organisationId,
		        p.connection_id AS connectionId, p.heartbeat_at AS heartbeatAt, p.rows_read AS rowsRead
		 FROM import_batches b
		 JOIN import_progress p ON p.import_batch_id = b.id
		 JOIN surveys s ON s.id = b.survey_id
		 JOIN assets a ON a.id = s.asset_id
		 WHERE b.state = 'running'`,
		{ type: QueryTypes.SELECT, useMaster: true }
	);
	return rows.map((r) => ({
		batchId: Number(r.batchId),
		organisationId: Number(r.organisationId),
		connectionId: r.connectionId == null ? null : Number(r.connectionId),
		heartbeatAt: r.heartbeatAt == null ? null : new Date(r.heartbeatAt as string | Date),
		rowsRead: Number(r.rowsRead)
	}));
}

/**
 * Of `ids`, the connections MariaDB still has open, asked of the primary the imports write to.
 * The list shows every connection of the app's own database user, and all of them with the
 * PROCESS privilege (scripts/db.sh grants it): every app process must use that one user.
 */
async function openConnections(ids: number[]): Promise<Set<number>> {
	if (ids.length === 0) return new Set();
	const rows = await sequelize().query<{ id: unknown }>(
		'SELECT ID AS id FROM information_schema.PROCESSLIST WHERE ID IN (?)',
		{ replacements: [ids], type: QueryTypes.SELECT, useMaster: true }
	);
	return new Set(rows.map((r) => Number(r.id)));
}

/** Fails one batch with its audit event, unless another sweep or its own end came first. */
async function failAbandoned(run: RunningImport): Promise<boolean> {
	return sequelize().transaction(async (transaction) => {
		const [changed] = await ImportBatch.update(
			{
				state: 'failed',
				errorMessage: ABANDONED_MESSAGE,
				rowsImported: 0,
				finishedAt: new Date()
			},
			{ where: { id: run.batchId, state: 'running' }, transaction }
		);
		if (changed === 0) return false;
		await recordAudit(
			{
				action: 'import.failed',
				organisationId: run.organisationId,
				subjectType: 'import_batch',
				subjectId: run.batchId,
				detail: { rowsRead: run.rowsRead, message: ABANDONED_MESSAGE }
			},
			transaction
		);
		return true;
	});
}

/**
 * Fails the running imports no process is behind any more (see isAbandoned); safe to run from
 * every app process at once. Returns how many this call failed.
 */
export async function failAbandonedImports(): Promise<number> {
	const running = await runningImports();
	if (running.length === 0) return 0;
	// Writing through several nodes of a cluster (DB_HOSTS), each node numbers and lists only
	// its own connections: an import running through another node is missing from this node's
	// list, and would be failed while it runs. Only the heartbeat can tell there.
	const open = writesThroughSeveralNodes(sequelize())
		? null
		: await openConnections(
				running.flatMap((r) => (r.connectionId === null ? [] : [r.connectionId]))
			);
	const nowMs = Date.now();
	let failed = 0;
	for (const run of running.filter((r) => isAbandoned(r, open, nowMs))) {
		if (!(await failAbandoned(run))) continue;
		failed++;
		// Its upload waits, here and in object storage, for an end that never came.
		await removeStagedCopies(run.batchId);
	}
	return failed;
}

/**
 * At start-up, so what a killed or crashed process left running is settled at once rather than
 * when someone next looks. Not awaited: a database that is down must not stop the app starting,
 * and every read of an import's status sweeps again.
 */
export function failAbandonedImportsAtStart(): void {
	failAbandonedImports().then(
		(failed) => {
			if (failed > 0) console.warn(`${failed} import(s) left running by an ended process failed`);
		},
		(err) => {
			const why = isDatabaseUnavailable(err) ? 'the database is unavailable' : err;
			console.warn('abandoned imports not checked at start-up:', why);
		}
	);
}
