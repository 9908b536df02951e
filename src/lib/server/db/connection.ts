import { Sequelize } from 'sequelize';
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
	DB_READ_REPLICAS: z.string().default('')
});

export type DatabaseSettings = z.infer<typeof databaseEnvSchema>;

/** Reads and checks the database settings; throws one message naming every bad variable. */
export function readDatabaseSettings(env: Record<string, string | undefined>): DatabaseSettings {
	const parsed = databaseEnvSchema.safeParse(env);
	if (!parsed.success) {
		const problems = parsed.error.issues.map((i) => `${i.path.join('.')}: ${i.message}`);
		throw new Error(`Database settings are incomplete: ${problems.join('; ')}`);
	}
	return parsed.data;
}

/**
 * One Sequelize instance for the whole process: dialect mariadb, a bounded pool, UTC.
 * Timeouts are set on purpose (docs/scaling.md): a query that runs past DB_QUERY_TIMEOUT_MS
 * fails rather than holding a request, and a connection that cannot be made in
 * DB_CONNECT_TIMEOUT_MS fails fast so /api/health can answer 503.
 */
export function createSequelize(settings: DatabaseSettings): Sequelize {
	const replicas = settings.DB_READ_REPLICAS.split(',')
		.map((s) => s.trim())
		.filter(Boolean)
		.map((hostPort) => {
			const [host, port] = hostPort.split(':');
			return { host, port: Number(port || settings.DB_PORT) };
		});
	const credentials = { username: settings.DB_USER, password: settings.DB_PASSWORD };
	return new Sequelize(settings.DB_NAME, settings.DB_USER, settings.DB_PASSWORD, {
		dialect: 'mariadb',
		host: settings.DB_HOST,
		port: settings.DB_PORT,
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
}
