/**
 * Every member's summary row (reading count and cover counts) equals its readings after every
 * kind of write — import by LOAD DATA and by batch, the entry grid in mm and in inches, a second
 * import into the same members, two imports at once, undo — since the population pages and
 * research read the rows instead of the readings. Checked two ways: the stored counts expanded
 * and compared with the readings table as a multiset, to the bit, and the same
 * rebuild-and-compare that `npm run db:check-summaries` runs (once through that command itself).
 */
import { execFile } from 'node:child_process';
import { Readable } from 'node:stream';
import { promisify } from 'node:util';
import { QueryTypes, type Sequelize } from 'sequelize';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { expandCounted } from '../../../src/lib/analysis';
import { countedFromSorted } from '../../../src/lib/analysis/countedSample';
import { ImportBatch, MemberCoverSet } from '../../../src/lib/server/db/models';
import { undoImport } from '../../../src/lib/server/import/batchActions';
import { receiveUpload, startImport } from '../../../src/lib/server/import/batches';
import { saveManualReadings } from '../../../src/lib/server/intake/manualEntry';
import type { Actor } from '../../../src/lib/server/policy';
import { checkCoverSummaries } from '../../../src/lib/server/readings/checkSummaries';
import { decodeCounts } from '../../../src/lib/server/readings/coverCountCodec';
import { readCoverCounts, rebuildCoverCounts } from '../../../src/lib/server/readings/coverSets';
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

/** Covers of the member straight from readings, sorted. */
async function readingCovers(sequelize: Sequelize, memberId: number): Promise<number[]> {
	const rows = await sequelize.query<{ c: number }>(
		'SELECT cover_mm AS c FROM readings WHERE member_id = ? ORDER BY cover_mm',
		{ replacements: [memberId], type: QueryTypes.SELECT }
	);
	return rows.map((r) => Number(r.c));
}

async function storedCovers(memberId: number): Promise<number[] | null> {
	const row = await MemberCoverSet.findByPk(memberId);
	if (!row) return null;
	if (row.coverCounts === null) return null;
	const grid =
		row.gridDen === null || row.gridFactor === null
			? null
			: { den: Number(row.gridDen), factor: Number(row.gridFactor) };
	const covers = Array.from(expandCounted(decodeCounts(row.coverCounts, grid)));
	expect(row.readingCount).toBe(covers.length);
	return covers;
}

async function expectInStep(sequelize: Sequelize, memberIds: number[]) {
	for (const id of memberIds) {
		const fromReadings = await readingCovers(sequelize, id);
		// A member that never had readings has no row; one whose readings went has an empty one.
		expect((await storedCovers(id)) ?? [], `member ${id}`).toEqual(fromReadings);
	}
}

/** One CSV imported whole by the given write method, with the settings its preview detected; its batch id. */
async function importBy(
	actor: Actor,
	surveyId: number,
	writeMethod: 'load-data' | 'bulk',
	text: string,
	mapping: typeof standardMapping,
	extra: Parameters<typeof options>[0] = {}
) {
	const upload = await receiveUpload(
		actor,
		surveyId,
		`${writeMethod}.csv`,
		Readable.from([Buffer.from(text)])
	);
	const { mixedDecimalMarks: _, ...detected } = upload.preview.settings;
	const started = await startImport(actor, upload.batchId, {
		mapping,
		options: options({ ...detected, ...extra }),
		confirmDuplicate: true,
		saveTemplateAs: null,
		writeMethod
	});
	expect((await started.done).state).toBe('completed');
	return upload.batchId;
}

describe('member summary rows stay equal to the readings', () => {
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
			await importBy(actor, survey.id, writeMethod, text, standardMapping, {
				acceptSmallCovers: true
			});
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
		await sequelize.transaction((t) => rebuildCoverCounts(t, [members[0].id]));
		await expectAllInStep(sequelize);
		const { stdout } = await promisify(execFile)('npx', ['tsx', 'scripts/check-summaries.ts'], {
			env: process.env
		});
		expect(stdout).toContain('every summary equals its readings');
	});

	it('after imports by LOAD DATA and by batch(), which write identical rows', async () => {
		const text = csv([
			'Member,X,Y,Cover,Note',
			'M-01,0,0,30.1,"tab\there"',
			'M-01,10,0,1e1,"back\\\\slash and ""quotes"""',
			'M-02,0,0,0.30000000000000004,"two\nlines"',
			'M-02,10,0,45,Ω ünïcode',
			'M-03,0,0,12.5,'
		]);
		const mapping = { ...standardMapping, note: 4 };
		const written: unknown[][] = [];
		for (const writeMethod of ['load-data', 'bulk'] as const) {
			const { survey, members } = await freshSurvey(actor);
			const batchId = await importBy(actor, survey.id, writeMethod, text, mapping);
			await expectInStep(
				sequelize,
				members.map((m) => m.id)
			);
			const rows = await sequelize.query<Record<string, unknown>>(
				`SELECT m.label, r.x_mm, r.y_mm, r.cover_mm, r.note, r.flags FROM readings r
				   JOIN members m ON m.id = r.member_id WHERE m.survey_id = ? ORDER BY r.id`,
				{ replacements: [survey.id], type: QueryTypes.SELECT }
			);
			written.push(rows.map((r) => Object.values(r)));
			const batch = await ImportBatch.findByPk(batchId);
			expect(batch!.firstReadingId).not.toBeNull();
			expect(Number(batch!.lastReadingId) - Number(batch!.firstReadingId)).toBeGreaterThanOrEqual(
				4
			);
		}
		expect(written[0]).toEqual(written[1]);
		// The values themselves came through exactly (0.1 + 0.2 is not 0.3 in binary).
		expect(written[0]).toContainEqual(['M-02', 0, 0, 0.30000000000000004, 'two\nlines', 0]);
		expect(written[0]).toContainEqual(['M-01', 0, 0, 30.1, 'tab\there', 0]);
		expect(written[0]).toContainEqual(['M-01', 10, 0, 10, 'back\\\\slash and "quotes"', 0]);
	});

	it('after a second import into the same members, and after undoing either', async () => {
		const { survey, members } = await freshSurvey(actor);
		const ids = members.map((m) => m.id);
		const first = await importFile(
			actor,
			survey.id,
			'a.csv',
			csv([HEADER, 'M-01,0,0,30', 'M-01,1,0,20', 'M-02,0,0,41'])
		);
		const second = await importFile(
			actor,
			survey.id,
			'b.csv',
			csv([HEADER, 'M-01,2,0,25', 'M-01,3,0,30', 'M-03,0,0,50'])
		);
		expect(await storedCovers(ids[0])).toEqual([20, 25, 30, 30]);
		await expectInStep(sequelize, ids);
		expect(await undoImport(actor, first.batch.id)).toBe(3);
		expect(await storedCovers(ids[0])).toEqual([25, 30]);
		expect(await storedCovers(ids[1])).toEqual([]);
		await expectInStep(sequelize, ids);
		expect(await undoImport(actor, second.batch.id)).toBe(3);
		await expectInStep(sequelize, ids);
		expect((await readCoverCounts(ids)).size).toBe(0);
	});

	it('when two imports into the same member run at once', async () => {
		const { survey, members } = await freshSurvey(actor);
		const lines = (offset: number) =>
			csv([
				HEADER,
				...Array.from({ length: 60_000 }, (_, i) => `M-01,${offset + i},0,${20 + (i % 300) / 10}`)
			]);
		const uploads = await Promise.all(
			[0, 1_000_000].map((offset, i) =>
				receiveUpload(actor, survey.id, `par-${i}.csv`, Readable.from([Buffer.from(lines(offset))]))
			)
		);
		const runs = await Promise.all(
			uploads.map((u) =>
				startImport(actor, u.batchId, {
					mapping: standardMapping,
					options: options(),
					confirmDuplicate: true,
					saveTemplateAs: null
				})
			)
		);
		const outcomes = await Promise.all(runs.map((r) => r.done));
		expect(outcomes.map((o) => o.state)).toEqual(['completed', 'completed']);
		expect((await storedCovers(members[0].id))!.length).toBe(120_000);
		await expectInStep(sequelize, [members[0].id]);
	});

	it('refuses to delete a batch whose readings remain, and allows it once they are undone', async () => {
		const { survey } = await freshSurvey(actor);
		const done = await importFile(actor, survey.id, 'keep.csv', csv([HEADER, 'M-01,0,0,33']));
		await expect(ImportBatch.destroy({ where: { id: done.batch.id } })).rejects.toThrow(
			/readings remain cannot be deleted/
		);
		await undoImport(actor, done.batch.id);
		expect(await ImportBatch.destroy({ where: { id: done.batch.id } })).toBe(1);
	});

	it('reads members whose readings predate their summary row from the readings themselves', async () => {
		const { survey, members } = await freshSurvey(actor);
		await importFile(actor, survey.id, 'old.csv', csv([HEADER, 'M-01,0,0,31', 'M-01,1,0,29']));
		await MemberCoverSet.destroy({ where: { memberId: members[0].id } });
		expect(Array.from((await readCoverCounts([members[0].id])).get(members[0].id)!.values)).toEqual(
			[29, 31]
		);
		// Reading does not write; rebuilt here so the summaries check of other files finds every
		// member in step (the first test here runs it over the whole database).
		await sequelize.transaction((t) => rebuildCoverCounts(t, [members[0].id]));
		expect(await MemberCoverSet.count({ where: { memberId: members[0].id } })).toBe(1);
	});

	it('counts a row written before counts were kept whole from the readings when an import adds to it', async () => {
		const { survey, members } = await freshSurvey(actor);
		const id = members[0].id;
		await importFile(actor, survey.id, 'early.csv', csv([HEADER, 'M-01,0,0,31', 'M-01,1,0,29']));
		// As migration 012 left a member stored before it: a reading count, no counts.
		await MemberCoverSet.update({ coverCounts: null }, { where: { memberId: id } });
		await importFile(actor, survey.id, 'later.csv', csv([HEADER, 'M-01,2,0,35']));
		expect(await storedCovers(id)).toEqual([29, 31, 35]);
		await expectInStep(sequelize, [id]);
	});
});
