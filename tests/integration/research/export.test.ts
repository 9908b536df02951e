import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { QueryTypes, type Sequelize } from 'sequelize';
import {
	Asset,
	Membership,
	Organisation,
	ResearchExport,
	User
} from '../../../src/lib/server/db/models';
import { setConsent } from '../../../src/lib/server/research/consent';
import { startReadingsExport } from '../../../src/lib/server/research/exportStream';
import { batchSql } from '../../../src/lib/server/research/readings';
import { researchFilterSchema, type ResearchFilter } from '../../../src/lib/server/research/filter';
import {
	researchReadingSchema,
	type ResearchReading
} from '../../../src/lib/server/research/schemas';
import { testSequelize } from '../../helpers/database';
import { identifyingTextsIn } from '../../helpers/research';

let sequelize: Sequelize;
const secret = () => process.env.RESEARCH_ID_SECRET!;
const everything: ResearchFilter = researchFilterSchema.parse({});
let researcher: { userId: number; organisationId: number };
let consultancy: Awaited<ReturnType<typeof actorOf>>;

async function exportText(filter: ResearchFilter, format: 'readings-csv' | 'readings-jsonl') {
	const started = await startReadingsExport(sequelize, secret(), researcher, filter, format);
	return { id: started.exportId, text: await new Response(started.stream).text() };
}

async function exportRows(filter = everything): Promise<ResearchReading[]> {
	const { text } = await exportText(filter, 'readings-jsonl');
	return text
		.trim()
		.split('\n')
		.map((line) => researchReadingSchema.parse(JSON.parse(line)));
}

async function expectedCount(): Promise<number> {
	const row = await sequelize.query<{ n: number }>(
		`SELECT COUNT(*) AS n FROM readings r JOIN members m ON m.id = r.member_id
		   JOIN surveys s ON s.id = m.survey_id JOIN assets a ON a.id = m.asset_id
		  WHERE a.research_opt_in = 1 AND s.status IN ('submitted', 'approved')`,
		{ type: QueryTypes.SELECT, plain: true }
	);
	return Number(row!.n);
}

async function actorOf(email: string) {
	const user = await User.findOne({ where: { email } });
	const membership = await Membership.findOne({ where: { userId: user!.id } });
	return { userId: user!.id, organisationId: membership!.organisationId, role: membership!.role };
}

beforeAll(async () => {
	sequelize = testSequelize();
	researcher = await actorOf('researcher@durability-collective.example');
	consultancy = await actorOf('admin@kestrel-lane.example');
});
afterAll(() => sequelize.close());

describe('research export (service layer, real MariaDB)', () => {
	it('streams every opted-in reading, each row matching the schema, and records the export', async () => {
		const { id, text } = await exportText(everything, 'readings-jsonl');
		const lines = text.trim().split('\n');
		expect(lines.length).toBe(await expectedCount());
		expect(lines.length).toBeGreaterThan(1000);
		for (const line of lines.slice(0, 200)) researchReadingSchema.parse(JSON.parse(line));
		const record = await ResearchExport.findByPk(id);
		expect(Number(record!.rowCount)).toBe(lines.length);
		expect(record!.engineVersion).toMatch(/^\d+\.\d+\.\d+$/);
		expect(record!.format).toBe('readings-jsonl');
	});

	it('contains no name, location, note, label, organisation or person of the demo', async () => {
		for (const format of ['readings-csv', 'readings-jsonl'] as const) {
			const { text } = await exportText(everything, format);
			expect(identifyingTextsIn(text)).toEqual([]);
		}
	});

	it('keeps identifiers stable between two exports and different between assets', async () => {
		const first = await exportRows();
		const second = await exportRows();
		expect(second.map((r) => r.memberRef)).toEqual(first.map((r) => r.memberRef));
		const assets = new Set(first.map((r) => r.assetRef));
		expect(assets.size).toBe(2); // the car park and the office; the footbridge is not opted in
		const membersPerAsset = new Map<string, Set<string>>();
		for (const r of first) {
			if (!membersPerAsset.has(r.assetRef)) membersPerAsset.set(r.assetRef, new Set());
			membersPerAsset.get(r.assetRef)!.add(r.memberRef);
		}
		const [a, b] = [...membersPerAsset.values()];
		expect([...a].some((ref) => b.has(ref))).toBe(false);
	});

	it('drops an asset from a new export once its owner opts it out, and audits the change', async () => {
		const consultancyOrg = await Organisation.findByPk(consultancy.organisationId);
		const office = await Asset.findOne({
			where: { name: 'Orchard Row Office Building', organisationId: consultancyOrg!.id }
		});
		const before = await exportRows();
		const officeMembers = await sequelize.query<{ n: number }>(
			'SELECT COUNT(*) AS n FROM readings r JOIN members m ON m.id = r.member_id WHERE m.asset_id = ?',
			{ type: QueryTypes.SELECT, plain: true, replacements: [office!.id] }
		);
		await setConsent(consultancy, office!.id, false);
		try {
			const after = await exportRows();
			expect(before.length - after.length).toBe(Number(officeMembers!.n));
			expect(new Set(after.map((r) => r.assetRef)).size).toBe(1);
			const audit = await sequelize.query<{ action: string }>(
				"SELECT action FROM audit_events WHERE subject_type = 'asset' AND subject_id = ? ORDER BY id DESC LIMIT 1",
				{ type: QueryTypes.SELECT, replacements: [String(office!.id)] }
			);
			expect(audit[0].action).toBe('research.opt_out');
		} finally {
			await setConsent(consultancy, office!.id, true);
		}
	});

	it('narrows by the filter: decks only, built in the 1990s', async () => {
		const rows = await exportRows(
			researchFilterSchema.parse({ memberType: ['deck'], decade: ['1990'] })
		);
		expect(rows.length).toBeGreaterThan(0);
		expect(rows.every((r) => r.memberType === 'deck' && r.constructionDecade === 1990)).toBe(true);
		expect(rows.every((r) => Math.abs(r.deviationMm - (r.coverMm - r.cNomMm)) < 1e-3)).toBe(true);
	});

	it('writes a CSV with the header first and one line per reading', async () => {
		const { text } = await exportText(
			researchFilterSchema.parse({ memberType: ['column'] }),
			'readings-csv'
		);
		const lines = text.trimEnd().split('\r\n');
		expect(lines[0]).toBe(Object.keys(researchReadingSchema.shape).join(','));
		const rows = await exportRows(researchFilterSchema.parse({ memberType: ['column'] }));
		expect(lines.length - 1).toBe(rows.length);
	});

	it('reads each batch as a range of the primary key in key order, without a filesort', async () => {
		const members = await sequelize.query<{ id: number }>('SELECT id FROM members LIMIT 20', {
			type: QueryTypes.SELECT
		});
		for (const where of ['r.member_id = :m AND r.id > :id', 'r.member_id IN (:part)']) {
			const [plan] = await sequelize.query<{ key: string; Extra: string }>(
				`EXPLAIN ${batchSql(where)}`,
				{
					type: QueryTypes.SELECT,
					replacements: {
						m: members[0].id,
						id: 0,
						part: members.map((m) => m.id),
						untilId: Number.MAX_SAFE_INTEGER,
						n: 5000
					}
				}
			);
			expect(plan.key).toBe('PRIMARY');
			expect(plan.Extra).not.toContain('filesort');
		}
	});
});
