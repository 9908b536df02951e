/**
 * The members' summary rows hold exactly the counts of their readings' covers after every kind
 * of write, since the population pages read them instead of the readings. Each check expands the
 * stored counts and compares them with the readings table itself, as a multiset, to the bit.
 */
import { Readable } from 'node:stream';
import { QueryTypes, type Sequelize } from 'sequelize';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ImportBatch, Member, MemberCoverSet } from '../../../src/lib/server/db/models';
import { undoImport } from '../../../src/lib/server/import/batchActions';
import { receiveUpload, startImport } from '../../../src/lib/server/import/batches';
import { expandCounted } from '../../../src/lib/analysis';
import { decodeCounts } from '../../../src/lib/server/readings/coverCountCodec';
import { readCoverCounts, rebuildCoverCounts } from '../../../src/lib/server/readings/coverSets';
import type { Actor } from '../../../src/lib/server/policy';
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

	it('for every member of the seeded demo', async () => {
		const members = await Member.findAll({ attributes: ['id'] });
		expect(members.length).toBeGreaterThan(40);
		await expectInStep(
			sequelize,
			members.map((m) => m.id)
		);
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
			const upload = await receiveUpload(
				actor,
				survey.id,
				`${writeMethod}.csv`,
				Readable.from([Buffer.from(text)])
			);
			const { mixedDecimalMarks: _, ...detected } = upload.preview.settings;
			const started = await startImport(actor, upload.batchId, {
				mapping,
				options: options(detected),
				confirmDuplicate: true,
				saveTemplateAs: null,
				writeMethod
			});
			expect((await started.done).state).toBe('completed');
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
			const batch = await ImportBatch.findByPk(upload.batchId);
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
		// member in step (cover-counts.test.ts runs it over the whole database).
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
