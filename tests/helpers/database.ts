import { QueryTypes, type Sequelize } from 'sequelize';
import { createSequelize, readDatabaseSettings } from '../../src/lib/server/db/connection';
import { initModels } from '../../src/lib/server/db/models';

/** A Sequelize instance on the test instance's own database (the one the built app uses). */
export function testSequelize(): Sequelize {
	const sequelize = createSequelize(readDatabaseSettings(process.env));
	initModels(sequelize);
	return sequelize;
}

/**
 * A separate, empty database on the test instance, for tests that must own the whole schema
 * (migrations up and down, seeding twice). Dropped by `drop()`.
 */
export async function scratchDatabase(suffix: string) {
	const settings = readDatabaseSettings(process.env);
	const name = `${settings.DB_NAME}_${suffix}`;
	const admin = createSequelize(settings);
	await admin.query(`DROP DATABASE IF EXISTS \`${name}\``, { type: QueryTypes.RAW });
	await admin.query(
		`CREATE DATABASE \`${name}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`,
		{
			type: QueryTypes.RAW
		}
	);
	const sequelize = createSequelize({ ...settings, DB_NAME: name });
	return {
		sequelize,
		async tables(): Promise<string[]> {
			const rows = await sequelize.query<{ name: string }>(
				'SELECT table_name AS name FROM information_schema.tables WHERE table_schema = DATABASE() ORDER BY table_name',
				{ type: QueryTypes.SELECT }
			);
			return rows.map((r) => r.name);
		},
		async drop(): Promise<void> {
			await sequelize.close();
			await admin.query(`DROP DATABASE IF EXISTS \`${name}\``, { type: QueryTypes.RAW });
			await admin.close();
		}
	};
}
