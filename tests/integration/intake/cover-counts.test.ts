/**
 * Every member's cover counts (migration 012) equal the counts of its readings after every kind
 * of write — import by LOAD DATA and by batch, the entry grid in mm and in inches, a second
 * import into the same members, undo — checked by the same rebuild-and-compare that
 * `npm run db:check-summaries` runs, and once through that command itself.
 */
import { execFile } from 'node:child_process';
import { Readable } from 'node:stream';
import { promisify } from 'node:util';
import { QueryTypes, type Sequelize } from 'sequelize';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { countedFromSorted } from '../../../src/lib/analysis/countedSample';
import { MemberCoverSet } from '../../../src/lib/server/db/models';
import { undoImport } from '../../../src/lib/server/import/batchActions';
import { receiveUpload, startImport } from '../../../src/lib/server/import/batches';
import { saveManualReadings } from '../../../src/lib/server/intake/manualEntry';
import type { Actor } from '../../../src/lib/server/policy';
import { checkCoverSummaries } from '../../../src/lib/server/readings/checkSummaries';
import { readCoverCounts } from '../../../src/lib/server/readings/coverSets';
import {
	actorFor,
	csv,
	freshSurvey,
	importFile,
	options,
	standardMapping,
	testSequelize
} from '../../helpers/intake';

const HEADER = 'Member,X,Y,Cover';

async function expectAllInStep(sequelize: Sequelize) {
	const check = await checkCoverSummaries(sequelize);
	expect(check.mismatches).toEqual([]);
	expect(check.readingsChecked).toBeGreaterThan(0);
}

/** The member's counts as the app reads them, against counts drawn from its readings. */
async function expectCountsOfReadings(sequelize: Sequelize, memberId: number) {
	const rows = await sequelize.query<{ c: number }>(
		'SELECT cover_mm AS c FROM readings WHERE member_id = ? ORDER BY cover_mm',
		{ replacements: [memberId], type: QueryTypes.SELECT }
	);
	const stored = (await readCoverCounts([memberId])).get(memberId);
	if (rows.length === 0) return expect(stored).toBeUndefined();
	const expected = countedFromSorted(Float64Array.from(rows.map((r) => Number(r.c))));
	expect(Array.from(stored!.values)).toEqual(Array.from(expected.values));
	expect(Array.from(stored!.counts)).toEqual(Array.from(expected.counts));
	expect(stored!.lattice?.grid ?? null).toEqual(expected.lattice?.grid ?? null);
	return stored!;
}

describe('member cover counts stay equal to the readings', () => {
	let sequelize: Sequelize;
	let actor: Actor;
	beforeAll(async () => {
		sequelize = testSequelize();
		actor = await actorFor('surveyor@kestrel-lane.example');
	});
	afterAll(async () => {
		await sequelize.close();
	});

	it('for the seeded demo', async () => {
		await expectAllInStep(sequelize);
	});

	it('after imports by LOAD DATA and by batch, on and off the meter grid', async () => {
		for (const writeMethod of ['load-data', 'bulk'] as const) {
			const { survey, members } = await freshSurvey(actor);
			const text = csv([
				HEADER,
				'M-01,0,0,30.1',
				'M-01,1,0,30.1',
				'M-01,2,0,31',
				'M-02,0,0,0.30000000000000004',
				'M-02,1,0,45',
				'M-03,0,0,12.5'
			]);
			const upload = await receiveUpload(
				actor,
				survey.id,
				`${writeMethod}.csv`,
				Readable.from([Buffer.from(text)])
			);
			const { mixedDecimalMarks: _, ...detected } = upload.preview.settings;
			const started = await startImport(actor, upload.batchId, {
				mapping: standardMapping,
				options: options({ ...detected, acceptSmallCovers: true }),
				confirmDuplicate: true,
				saveTemplateAs: null,
				writeMethod
			});
			expect((await started.done).state).toBe('completed');
			const m1 = await expectCountsOfReadings(sequelize, members[0].id);
			// 0.1 mm grid: 30.1 mm is 301 steps, held twice.
			expect(m1!.lattice!.grid).toEqual({ den: 10, factor: 1 });
			expect(Array.from(m1!.lattice!.steps)).toEqual([301, 310]);
			expect(Array.from(m1!.counts)).toEqual([2, 1]);
			// 0.1 + 0.2 is on no grid: kept as the double itself.
			expect((await expectCountsOfReadings(sequelize, members[1].id))!.lattice).toBeNull();
			await expectCountsOfReadings(sequelize, members[2].id);
			await expectAllInStep(sequelize);
		}
	});

	it('after the entry grid in mm and in inches, a second import and undoing each', async () => {
		const { survey, members } = await freshSurvey(actor);
		const ids = members.map((m) => m.id);
		const grid = await saveManualReadings(actor, ids[0], {
			units: 'inch',
			rows: ['1.05', '1.10', '1.10', '1.25'].map((cover, i) => ({
				x: String(i),
				y: '',
				cover,
				diameter: '',
				direction: '',
				note: ''
			}))
		});
		expect(grid.state).toBe('completed');
		const inches = await expectCountsOfReadings(sequelize, ids[0]);
		// The import rounds a converted length to a millionth of a mm, so 0.05 in steps (1.27 mm)
		// arrive as exact hundredths of a mm: the counts sit on the 0.01 mm grid.
		expect(inches!.lattice!.grid).toEqual({ den: 100, factor: 1 });
		await expectAllInStep(sequelize);
		const first = await importFile(
			actor,
			survey.id,
			'a.csv',
			csv([HEADER, 'M-01,0,0,30', 'M-01,1,0,20', 'M-02,0,0,41'])
		);
		// The member now mixes inch and mm readings: the grid is whatever holds both, or none.
		await expectCountsOfReadings(sequelize, ids[0]);
		const second = await saveManualReadings(actor, ids[1], {
			units: 'mm',
			rows: ['41', '41', '39.5'].map((cover, i) => ({
				x: String(i),
				y: '',
				cover,
				diameter: '',
				direction: '',
				note: ''
			}))
		});
		expect(second.state).toBe('completed');
		expect(Array.from((await expectCountsOfReadings(sequelize, ids[1]))!.counts)).toEqual([1, 3]);
		await expectAllInStep(sequelize);
		await undoImport(actor, first.batch.id);
		await expectCountsOfReadings(sequelize, ids[0]);
		expect(Array.from((await expectCountsOfReadings(sequelize, ids[1]))!.counts)).toEqual([1, 2]);
		await expectAllInStep(sequelize);
		await undoImport(actor, grid.batchId);
		await undoImport(actor, second.batchId);
		for (const id of ids) await expectCountsOfReadings(sequelize, id);
		expect((await readCoverCounts(ids)).size).toBe(0);
		await expectAllInStep(sequelize);
	});

	it('counts a member whose row predates the counts from its readings, and the check names it', async () => {
		const { survey, members } = await freshSurvey(actor);
		await importFile(actor, survey.id, 'old.csv', csv([HEADER, 'M-01,0,0,31', 'M-01,1,0,29']));
		await MemberCoverSet.update({ coverCounts: null }, { where: { memberId: members[0].id } });
		expect(Array.from((await readCoverCounts([members[0].id])).get(members[0].id)!.values)).toEqual(
			[29, 31]
		);
		const check = await checkCoverSummaries(sequelize);
		expect(check.mismatches).toEqual([
			{ memberId: members[0].id, problem: 'cover counts not written' }
		]);
		// npm run db:check-summaries reports the same and fails.
		const run = promisify(execFile)('npx', ['tsx', 'scripts/check-summaries.ts'], {
			env: process.env
		});
		await expect(run).rejects.toMatchObject({
			stderr: expect.stringContaining(`member ${members[0].id}: cover counts not written`)
		});
		// Repaired by rebuilding, the check passes again.
		const { rebuildCoverCounts } = await import('../../../src/lib/server/readings/coverSets');
		await sequelize.transaction((t) => rebuildCoverCounts(t, [members[0].id]));
		await expectAllInStep(sequelize);
		const { stdout } = await promisify(execFile)('npx', ['tsx', 'scripts/check-summaries.ts'], {
			env: process.env
		});
		expect(stdout).toContain('every summary equals its readings');
	});
});
