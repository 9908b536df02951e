import type { Connection } from 'mariadb';
import { ConnectionError, Sequelize } from 'sequelize';
import { z } from 'zod';

/** Database settings, read from the environment (see .env.example). */
const databaseEnvSchema = z.object({
	DB_HOST: z.string().min(1).default('127.0.0.1'),
	DB_PORT: z.coerce.number().int().min(1).max(65535).default(3307),
	DB_NAME: z.string().min(1, 'DB_NAME is required'),
	DB_USER: z.string().min(1, 'DB_USER is required'),
	DB_PASSWORD: z.string().default(''),
	DB_POOL_MAX: z.coerce.number().int().min(1).max(200).default(10),
	DB_QUERY_TIMEOUT_MS: z.coerce.number().int().min(100).default(30_000),
	DB_CONNECT_TIMEOUT_MS: z.coerce.number().int().min(100).default(5_000),
	DB_READ_REPLICAS: z.string().default(''),
	/**
	 * Nodes that all take writes (a Galera cluster), comma-separated host:port, this process's
	 * preferred node first. When set, DB_HOST and DB_PORT are not used.
	 */
	DB_HOSTS: z.string().default('')
});

export type DatabaseSettings = z.infer<typeof databaseEnvSchema>;

/** Reads and checks the database settings; throws one message naming every bad variable. */
export function readDatabaseSettings(env: Record<string, string | undefined>): DatabaseSettings {
	const parsed = databaseEnvSchema.safeParse(env);
	if (!parsed.success) {
		const problems = parsed.error.issues.map((i) => `${i.path.join('.')}: ${i.message}`);
		throw new Error(`Database settings are incomplete: ${problems.join('; ')}`);
	}
	if (parsed.data.DB_HOSTS.trim() && parsed.data.DB_READ_REPLICAS.trim()) {
		throw new Error(
			'Database settings are incomplete: DB_HOSTS: every node of a cluster serves reads too; leave DB_READ_REPLICAS empty'
		);
	}
	return parsed.data;
}

export interface DatabaseNode {
	host: string;
	port: number;
}

/** "host:port, host:port" as nodes, the port defaulting to `defaultPort`. */
function parseNodes(list: string, defaultPort: number): DatabaseNode[] {
	return list
		.split(',')
		.map((s) => s.trim())
		.filter(Boolean)
		.map((hostPort) => {
			const [host, port] = hostPort.split(':');
			return { host, port: Number(port || defaultPort) };
		});
}

/** The writable nodes a Sequelize instance connects to (one unless DB_HOSTS lists several). */
const nodesOfInstance = new WeakMap<Sequelize, DatabaseNode[]>();

/**
 * Whether the instance writes through several nodes. Connection ids are then per node, so the
 * process list of the node a query lands on says nothing about a connection on another.
 */
export function writesThroughSeveralNodes(sequelize: Sequelize): boolean {
	return (nodesOfInstance.get(sequelize)?.length ?? 1) > 1;
}

/** How long a node that refused a connection is tried only after the others. */
const NODE_RETRY_AFTER_MS = 5_000;

/**
 * Galera's own word on whether a node may serve the app: part of the primary component
 * (wsrep_ready) and in step with it (Synced). A node left alone by a partition, one still
 * receiving its copy (Joiner) or one sending a copy (Donor, writes paused by rsync's snapshot)
 * answers no, and the next node is tried.
 */
async function nodeServes(connection: Connection): Promise<boolean> {
	const rows = (await connection.query(
		`SELECT VARIABLE_NAME AS name, VARIABLE_VALUE AS value FROM information_schema.GLOBAL_STATUS
		  WHERE VARIABLE_NAME IN ('WSREP_READY', 'WSREP_LOCAL_STATE_COMMENT')`
	)) as { name: string; value: string }[];
	const status = new Map(rows.map((r) => [r.name.toUpperCase(), r.value]));
	return status.get('WSREP_READY') === 'ON' && status.get('WSREP_LOCAL_STATE_COMMENT') === 'Synced';
}

/** MariaDB's answer when a Galera node has lost its quorum: it refuses every query. */
const ER_NODE_NOT_READY = 1047;

/**
 * New connections go to the first node, in the order of DB_HOSTS, that accepts them and is a
 * synced member of the cluster; a node that failed is tried last for a few seconds, so that
 * a dead host costs one connect timeout rather than one a connection. A connection whose node
 * drops out of the primary component is closed at its first refused query, so the pool opens
 * the next on a node that serves. Each session waits for the writes the cluster has committed
 * before it reads (wsrep_sync_wait=1): a session created through one node is found through any
 * other at once.
 */
function connectThroughNodes(sequelize: Sequelize, nodes: DatabaseNode[]): void {
	const manager = sequelize.connectionManager as unknown as {
		connect(config: Record<string, unknown>): Promise<Connection>;
	};
	const connectTo = manager.connect.bind(manager);
	const failedAt = new Map<string, number>();
	manager.connect = async (config) => {
		const now = Date.now();
		const recentlyFailed = (n: DatabaseNode) =>
			now - (failedAt.get(`${n.host}:${n.port}`) ?? -Infinity) < NODE_RETRY_AFTER_MS;
		const order = [
			...nodes.filter((n) => !recentlyFailed(n)),
			...nodes.filter((n) => recentlyFailed(n))
		];
		let lastError: unknown = null;
		for (const node of order) {
			const key = `${node.host}:${node.port}`;
			let connection: Connection | null = null;
			try {
				connection = await connectTo({ ...config, host: node.host, port: node.port });
				if (await nodeServes(connection)) {
					await connection.query('SET SESSION wsrep_sync_wait = 1');
					failedAt.delete(key);
					return closedWhenNodeLeaves(connection);
				}
				lastError = new ConnectionError(
					new Error(`database node ${key} is not a synced member of the cluster`)
				);
			} catch (err) {
				lastError = err;
			}
			failedAt.set(key, Date.now());
			await connection?.end().catch(() => connection?.destroy());
		}
		throw lastError;
	};
}

/** Closes the connection when its node answers that it has left the primary component. */
function closedWhenNodeLeaves(connection: Connection): Connection {
	const query = connection.query.bind(connection);
	connection.query = (async (...args: Parameters<Connection['query']>) => {
		try {
			return await query(...args);
		} catch (err) {
			if ((err as { errno?: number }).errno === ER_NODE_NOT_READY) connection.destroy();
			throw err;
		}
	}) as Connection['query'];
	return connection;
}

/**
 * One Sequelize instance for the whole process: dialect mariadb, a bounded pool, UTC. With
 * DB_HOSTS, its connections go to the first node of a Galera cluster that serves (see
 * connectThroughNodes; docs/scaling.md, "A Galera cluster").
 * Timeouts are set on purpose (docs/scaling.md): a query that runs past DB_QUERY_TIMEOUT_MS
 * fails rather than holding a request, and a connection that cannot be made in
 * DB_CONNECT_TIMEOUT_MS fails fast so /api/health can answer 503.
 */
export function createSequelize(settings: DatabaseSettings): Sequelize {
	const replicas = parseNodes(settings.DB_READ_REPLICAS, settings.DB_PORT);
	const nodes = parseNodes(settings.DB_HOSTS, settings.DB_PORT);
	const first = nodes[0] ?? { host: settings.DB_HOST, port: settings.DB_PORT };
	const credentials = { username: settings.DB_USER, password: settings.DB_PASSWORD };
	const sequelize = new Sequelize(settings.DB_NAME, settings.DB_USER, settings.DB_PASSWORD, {
		dialect: 'mariadb',
		host: first.host,
		port: first.port,
		logging: false,
		timezone: '+00:00',
		benchmark: false,
		define: { underscored: true, charset: 'utf8mb4', collate: 'utf8mb4_unicode_ci' },
		pool: { max: settings.DB_POOL_MAX, min: 0, acquire: 10_000, idle: 10_000, evict: 5_000 },
		dialectOptions: {
			connectTimeout: settings.DB_CONNECT_TIMEOUT_MS,
			queryTimeout: settings.DB_QUERY_TIMEOUT_MS,
			// COUNT(*) and BIGINT ids come back as BigInt otherwise, which JSON.stringify rejects.
			bigIntAsNumber: true,
			decimalAsNumber: true,
			insertIdAsNumber: true,
			// The import writes its chunk files with LOAD DATA LOCAL INFILE (import/writer.ts). The
			// connector sends only the file named in the query itself, so a hostile server cannot
			// ask for any other file.
			permitLocalInfile: true,
			timezone: 'Z'
		},
		replication:
			replicas.length > 0
				? {
						write: { host: settings.DB_HOST, port: settings.DB_PORT, ...credentials },
						read: replicas.map((r) => ({ ...r, ...credentials }))
					}
				: false
	});
	if (nodes.length > 1) {
		nodesOfInstance.set(sequelize, nodes);
		connectThroughNodes(sequelize, nodes);
	}
	return sequelize;
}
