import { SequelizeStorage, Umzug } from 'umzug';
import type { QueryInterface, Sequelize } from 'sequelize';
import { migrations } from './migrations';

/** Versioned migrations, recorded in the `schema_migrations` table by umzug. */
export function createMigrator(sequelize: Sequelize, logger: Console | undefined = undefined) {
	return new Umzug<QueryInterface>({
		migrations: migrations.map((m) => ({ name: m.name, up: m.up, down: m.down })),
		context: sequelize.getQueryInterface(),
		storage: new SequelizeStorage({ sequelize, tableName: 'schema_migrations' }),
		logger
	});
}
