import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createMigrator } from '../../src/lib/server/db/migrator';
import { migrations } from '../../src/lib/server/db/migrations';
import { scratchDatabase } from '../helpers/database';

describe('migrations on a fresh database', () => {
	let scratch: Awaited<ReturnType<typeof scratchDatabase>>;
	beforeAll(async () => {
		scratch = await scratchDatabase('migrations');
	});
	afterAll(async () => {
		await scratch.drop();
	});

	it('go up, down to nothing and up again', async () => {
		const migrator = createMigrator(scratch.sequelize);
		const applied = await migrator.up();
		expect(applied.map((m) => m.name)).toEqual(migrations.map((m) => m.name));
		const tables = await scratch.tables();
		for (const table of [
			'organisations',
			'users',
			'memberships',
			'sessions',
			'assets',
			'surveys',
			'members',
			'readings',
			'verification_holes',
			'import_batches',
			'attachments',
			'assessments',
			'audit_events'
		]) {
			expect(tables).toContain(table);
		}

		await migrator.down({ to: 0 });
		// Only umzug's own record of migrations is left.
		expect(await scratch.tables()).toEqual(['schema_migrations']);
		expect(await migrator.executed()).toHaveLength(0);

		await migrator.up();
		expect((await migrator.pending()).length).toBe(0);
		expect((await scratch.tables()).length).toBe(tables.length);
	});

	it('each migration reverts on its own, newest first', async () => {
		const migrator = createMigrator(scratch.sequelize);
		for (let i = migrations.length - 1; i >= 0; i--) {
			const [reverted] = await migrator.down();
			expect(reverted.name).toBe(migrations[i].name);
		}
		expect(await migrator.executed()).toHaveLength(0);
	});
});
