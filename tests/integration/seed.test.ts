import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createMigrator } from '../../src/lib/server/db/migrator';
import { initModels, Member } from '../../src/lib/server/db/models';
import { formValuesOf } from '../../src/lib/intake/formValues';
import { memberSchema } from '../../src/lib/intake/schemas';
import { clearAllData, loadDemoScenario, summariseDemo } from '../../seeds/load';
import { demoPeople } from '../../seeds/scenario';
import { scratchDatabase } from '../helpers/database';

describe('demo scenario seeding', () => {
	let scratch: Awaited<ReturnType<typeof scratchDatabase>>;
	beforeAll(async () => {
		scratch = await scratchDatabase('seed');
		initModels(scratch.sequelize);
		await createMigrator(scratch.sequelize).up();
	});
	afterAll(async () => {
		// The app's own models are bound to this instance now; the suite's other files make their own.
		await scratch.drop();
	});

	it('is deterministic: two runs give the same counts, summary figures and assessments', async () => {
		await loadDemoScenario(scratch.sequelize);
		const first = await summariseDemo(scratch.sequelize);
		await clearAllData(scratch.sequelize);
		await loadDemoScenario(scratch.sequelize);
		const second = await summariseDemo(scratch.sequelize);
		expect(second).toEqual(first);
	});

	it('empties every data table on reset, the custom populations and plans included', async () => {
		const { QueryTypes } = await import('sequelize');
		const [asset] = await scratch.sequelize.query<{ id: number }>('SELECT id FROM assets LIMIT 1', {
			type: QueryTypes.SELECT
		});
		await scratch.sequelize.query(
			`INSERT INTO custom_populations (asset_id, name, member_ids, created_at)
			 VALUES (?, 'Left over', '[]', NOW())`,
			{ replacements: [asset.id], type: QueryTypes.RAW }
		);
		await clearAllData(scratch.sequelize);
		const tables = await scratch.sequelize.query<{ name: string }>(
			`SELECT table_name AS name FROM information_schema.tables
			 WHERE table_schema = DATABASE() AND table_type = 'BASE TABLE' AND table_name <> 'schema_migrations'`,
			{ type: QueryTypes.SELECT }
		);
		expect(tables.map((t) => t.name)).toContain('custom_populations');
		for (const { name } of tables) {
			const [row] = await scratch.sequelize.query<{ n: number }>(
				`SELECT COUNT(*) AS n FROM \`${name}\``,
				{ type: QueryTypes.SELECT }
			);
			expect([name, Number(row.n)]).toEqual([name, 0]);
		}
		await loadDemoScenario(scratch.sequelize);
	});

	it('is as large and varied as the scenario promises', async () => {
		const summary = await summariseDemo(scratch.sequelize);
		expect(summary.counts.readings).toBeGreaterThanOrEqual(20_000);
		expect(summary.counts.members).toBeGreaterThanOrEqual(30);
		expect(summary.counts.assets).toBeGreaterThanOrEqual(2);
		expect(summary.counts.verification_holes).toBeGreaterThan(0);
		expect(new Set(demoPeople.map((p) => p.role))).toEqual(
			new Set(['admin', 'engineer', 'surveyor', 'owner', 'researcher'])
		);
		// Realistic spread: every population's SD within the 3–12 mm band we generate for.
		for (const p of summary.populations) {
			if (p.n >= 20) expect(p.sdMm).toBeGreaterThan(3);
			if (p.n >= 20) expect(p.sdMm).toBeLessThan(14);
		}
		// One approved assessment a structure, each with its risk annex, for the owner's pages.
		expect(summary.counts.assessments).toBe(summary.counts.assets);
		expect(summary.counts.assessment_risks).toBe(summary.counts.assets);
		expect(summary.assessments.map((a) => a.state)).toEqual(
			Array(summary.counts.assets).fill('approved')
		);
		// Measured durability: chloride profiles on the car park (six on decks, two on columns) and a
		// dozen carbonation tests on the office frame, within the invented scenario's ranges.
		expect(summary.counts.chloride_profiles).toBe(8);
		expect(summary.counts.carbonation_tests).toBe(12);
		const increments = summary.measurements.chloride as { position: number; outermost: number }[];
		expect(increments.filter((i) => i.outermost).map((i) => i.position)).toEqual(Array(8).fill(1));
		for (const test of summary.measurements.carbonation as Record<string, string | number>[]) {
			const depths = (JSON.parse(String(test.depths_mm)) as number[]).concat(
				test.depth_mean_mm === null ? [] : [Number(test.depth_mean_mm)]
			);
			for (const d of depths) expect(d).toBeGreaterThanOrEqual(5);
			for (const d of depths) expect(d).toBeLessThanOrEqual(30);
		}
		// One small population, for the "not enough data" verdict.
		expect(summary.populations.some((p) => p.n < 20)).toBe(true);
	});

	it("gives members that pass the member form's own checks, c_nom = c_min + Δc_dev (EN 1992-1-1 (4.1)) among them", async () => {
		const members = await Member.findAll();
		expect(members.length).toBeGreaterThanOrEqual(30);
		const refused = members.flatMap((m) => {
			const parsed = memberSchema.safeParse(formValuesOf(m.get({ plain: true }), memberSchema));
			return parsed.success ? [] : [`${m.label}: ${parsed.error.issues[0].message}`];
		});
		expect(refused).toEqual([]);
	});
});
