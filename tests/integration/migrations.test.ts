import { QueryTypes, type Sequelize } from 'sequelize';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createMigrator } from '../../src/lib/server/db/migrator';
import { migrations } from '../../src/lib/server/db/migrations';
import {
	ASSESSMENT_STATES,
	ATTACHMENT_KINDS,
	CHLORIDE_BASES,
	DESIGN_CODES,
	IMPORT_KINDS,
	IMPORT_STATES,
	MEMBER_FACES,
	MEMBER_TYPES,
	ROLES,
	SURVEY_STATES,
	SYNC_KINDS
} from '../../src/lib/words';
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

	// The migrations copy their word lists (history must not change with the live list), so this
	// is what holds the two together: after every migration has run, each enum column allows
	// exactly the live list, in its order. Equality, not a superset either way: a value only the
	// live list has would be refused by the database on insert, and a value only the column has
	// could be stored but never offered, validated or shown. Adding a value means a migration
	// that widens the column, and this test fails until there is one.
	it('leave every enum column holding exactly the live word list', async () => {
		const columns = await scratch.sequelize.query<{ t: string; c: string; type: string }>(
			`SELECT TABLE_NAME AS t, COLUMN_NAME AS c, COLUMN_TYPE AS type FROM information_schema.COLUMNS
			  WHERE TABLE_SCHEMA = DATABASE() AND DATA_TYPE = 'enum'`,
			{ type: QueryTypes.SELECT }
		);
		const allowed = (table: string, column: string) => {
			const row = columns.find((r) => r.t === table && r.c === column);
			expect(row, `${table}.${column}`).toBeDefined();
			// MariaDB writes the type as enum('a','b',...); no value of ours holds a quote.
			return [...row!.type.matchAll(/'([^']*)'/g)].map((m) => m[1]);
		};
		const live: [string, string, readonly string[]][] = [
			['memberships', 'role', ROLES],
			['invitations', 'role', ROLES],
			['assets', 'design_code', DESIGN_CODES],
			['members', 'requirement_source', DESIGN_CODES],
			['members', 'member_type', MEMBER_TYPES],
			['members', 'face', MEMBER_FACES],
			['surveys', 'status', SURVEY_STATES],
			['assessments', 'state', ASSESSMENT_STATES],
			['import_batches', 'state', IMPORT_STATES],
			['import_batches', 'kind', IMPORT_KINDS],
			['attachments', 'kind', ATTACHMENT_KINDS],
			['sync_batches', 'kind', SYNC_KINDS],
			['chloride_profiles', 'basis', CHLORIDE_BASES]
		];
		for (const [table, column, list] of live) {
			expect(allowed(table, column), `${table}.${column}`).toEqual([...list]);
		}
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

/** An insert's new id, on a scratch database whose schema is part-way through the migrations. */
function inserter(sequelize: Sequelize) {
	return async (sql: string, replacements: unknown[] = []) =>
		(await sequelize.query(sql, { replacements, type: QueryTypes.INSERT }))[0] as number;
}

/**
 * An organisation, asset and survey written with SQL of the schema as 001–003 made it (the
 * models describe the newest schema), returning a function that adds members to the survey.
 */
async function scratchSurvey(sequelize: Sequelize) {
	const q = inserter(sequelize);
	const org = await q(
		"INSERT INTO organisations (name, slug, created_at, updated_at) VALUES ('Scratch', 'scratch', NOW(), NOW())"
	);
	const asset = await q(
		"INSERT INTO assets (organisation_id, name, design_code, design_service_life_years, created_at, updated_at) VALUES (?, 'A', 'EN 1992-1-1', 50, NOW(), NOW())",
		[org]
	);
	const survey = await q(
		"INSERT INTO surveys (asset_id, title, survey_date, created_at, updated_at) VALUES (?, 'S', '2025-01-01', NOW(), NOW())",
		[asset]
	);
	const member = (label: string) =>
		q(
			"INSERT INTO members (survey_id, asset_id, label, member_type, face, exposure_class, requirement_source, c_min_mm, c_nom_mm, delta_c_dev_mm, created_at, updated_at) VALUES (?, ?, ?, 'slab', 'top', 'XC3', 'EN 1992-1-1', 25, 35, 10, NOW(), NOW())",
			[survey, asset, label]
		);
	return { survey, member };
}

/** Migration 009's cover set: 8-byte little-endian doubles (IEEE 754 binary64), sorted. */
function decodeCovers(bytes: Buffer): number[] {
	const out: number[] = [];
	for (let at = 0; at < bytes.length; at += 8) out.push(bytes.readDoubleLE(at));
	return out;
}

describe('migration 009 on a database that already holds readings', () => {
	let scratch: Awaited<ReturnType<typeof scratchDatabase>>;
	beforeAll(async () => {
		scratch = await scratchDatabase('migration_009');
	});
	afterAll(async () => {
		await scratch.drop();
	});

	const covers = [31.5, 28, 0.1 + 0.2, 45, 28];

	it('keeps every reading, fills the cover sets and batch ranges, and reverts', async () => {
		const migrator = createMigrator(scratch.sequelize);
		await migrator.up({ to: '008-intake-progress' });
		const q = inserter(scratch.sequelize);
		const { survey, member: addMember } = await scratchSurvey(scratch.sequelize);
		const member = await addMember('M1');
		const batch = await q(
			"INSERT INTO import_batches (survey_id, source_format, state, created_at) VALUES (?, 'csv', 'completed', NOW())",
			[survey]
		);
		for (const cover of covers)
			await q('INSERT INTO readings (member_id, import_batch_id, cover_mm) VALUES (?, ?, ?)', [
				member,
				batch,
				cover
			]);

		await migrator.up({ to: '009-cover-sets' });
		const select = <T extends object>(sql: string) =>
			scratch.sequelize.query<T>(sql, { type: QueryTypes.SELECT });
		const [set] = await select<{ n: number; covers: Buffer }>(
			'SELECT reading_count AS n, covers_mm AS covers FROM member_cover_sets'
		);
		expect(Number(set.n)).toBe(5);
		expect(decodeCovers(set.covers)).toEqual([...covers].sort((a, b) => a - b));
		const [range] = await select<{ first: number; last: number }>(
			'SELECT first_reading_id AS first, last_reading_id AS last FROM import_batches'
		);
		expect([Number(range.first), Number(range.last)]).toEqual([1, 5]);
		// A reading written after the migration takes the next id from the sequence.
		await q('INSERT INTO readings (member_id, cover_mm) VALUES (?, 40)', [member]);
		const ids = await select<{ id: number }>('SELECT id FROM readings ORDER BY id');
		expect(ids.map((r) => Number(r.id))).toEqual([1, 2, 3, 4, 5, 6]);
		const keys = await select<{ Key_name: string; Column_name: string }>(
			'SHOW INDEX FROM readings'
		);
		expect(keys.map((k) => `${k.Key_name}.${k.Column_name}`)).toEqual([
			'PRIMARY.member_id',
			'PRIMARY.id'
		]);

		// Down through 009 itself (umzug's `to` is inclusive), whatever came after it.
		await migrator.down({ to: '009-cover-sets' });
		const back = await select<{ Key_name: string }>('SHOW INDEX FROM readings');
		expect(new Set(back.map((k) => k.Key_name))).toEqual(
			new Set(['PRIMARY', 'readings_member_cover', 'readings_import_batch_id'])
		);
		await q('INSERT INTO readings (member_id, cover_mm) VALUES (?, 41)', [member]);
		const after = await select<{ id: number; cover: number }>(
			'SELECT id, cover_mm AS cover FROM readings ORDER BY id'
		);
		expect(after.map((r) => Number(r.id))).toEqual([1, 2, 3, 4, 5, 6, 7]);
		expect(after.map((r) => Number(r.cover))).toEqual([...covers, 40, 41]);
	});
});

describe('migration 017 on a database that already holds cover counts', () => {
	let scratch: Awaited<ReturnType<typeof scratchDatabase>>;
	beforeAll(async () => {
		scratch = await scratchDatabase('migration_017');
	});
	afterAll(async () => {
		await scratch.drop();
	});

	it('rewrites grid counts in the live codec’s form, leaves off-grid counts, and reverts', async () => {
		const migrator = createMigrator(scratch.sequelize);
		await migrator.up({ to: '016-measurement-imports' });
		const q = inserter(scratch.sequelize);
		const { member } = await scratchSurvey(scratch.sequelize);
		// Migration 012's fixed form: int32 step, uint32 count, little-endian. Steps of 0.1 mm,
		// one of them far from the rest and a count past one varint byte.
		const entries: [number, number][] = [
			[281, 3],
			[282, 1],
			[290, 200],
			[1234, 70000]
		];
		const fixed = Buffer.alloc(entries.length * 8);
		entries.forEach(([k, n], i) => {
			fixed.writeInt32LE(k, i * 8);
			fixed.writeUInt32LE(n, i * 8 + 4);
		});
		const offGrid = Buffer.alloc(12);
		offGrid.writeDoubleLE(0.1 + 0.2, 0);
		offGrid.writeUInt32LE(2, 8);
		const onGridId = await member('on grid');
		const offGridId = await member('off grid');
		await q(
			"INSERT INTO member_cover_sets (member_id, reading_count, covers_mm, grid_den, grid_factor, distinct_covers, cover_counts) VALUES (?, 70204, '', 10, 1, 4, ?), (?, 2, '', NULL, NULL, 1, ?)",
			[onGridId, fixed, offGridId, offGrid]
		);
		const stored = async () =>
			new Map(
				(
					await scratch.sequelize.query<{ id: number; counts: Buffer }>(
						'SELECT member_id AS id, cover_counts AS counts FROM member_cover_sets',
						{ type: QueryTypes.SELECT }
					)
				).map((r) => [Number(r.id), Buffer.from(r.counts)])
			);

		await migrator.up({ to: '017-shorter-cover-counts' });
		const after = await stored();
		const grid = { den: 10, factor: 1 };
		// What the live codec writes for the same counts, and what it reads back.
		const { encodeCounts, decodeCounts } =
			await import('../../src/lib/server/readings/coverCountCodec');
		const sample = decodeCounts(after.get(onGridId)!, grid);
		expect(Array.from(sample.lattice!.steps)).toEqual(entries.map(([k]) => k));
		expect(Array.from(sample.counts)).toEqual(entries.map(([, n]) => n));
		expect(after.get(onGridId)!.equals(encodeCounts(sample).bytes)).toBe(true);
		// ZigZag(281) = 562 = 0xb2 0x04; gaps 0, 7, 943 (0xaf 0x07); 200 = 0xc8 0x01;
		// 70000 = 0xf0 0xa2 0x04 (LEB128, Protocol Buffers encoding guide's rule).
		expect(after.get(onGridId)!.toString('hex')).toBe('b20403' + '0001' + '07c801' + 'af07f0a204');
		expect(after.get(offGridId)!.equals(offGrid)).toBe(true);

		await migrator.down({ to: '017-shorter-cover-counts' });
		const back = await stored();
		expect(back.get(onGridId)!.equals(fixed)).toBe(true);
		expect(back.get(offGridId)!.equals(offGrid)).toBe(true);
	});
});
