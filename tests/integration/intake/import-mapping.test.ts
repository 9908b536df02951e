import { Readable } from 'node:stream';
import { QueryTypes, type Sequelize } from 'sequelize';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ImportBatch, Member } from '../../../src/lib/server/db/models';
import { dashboardFor } from '../../../src/lib/server/dashboard';
import { EXPIRED_MESSAGE } from '../../../src/lib/server/import/expirePending';
import { receiveUpload } from '../../../src/lib/server/import/batches';
import { columnMappingSchema } from '../../../src/lib/server/import/mapping';
import { memberView } from '../../../src/lib/server/populations/member';
import type { Actor } from '../../../src/lib/server/policy';
import { appUrl } from '../../helpers/env';
import {
	actorFor,
	countReadings,
	csv,
	freshSurvey,
	importFile,
	testSequelize
} from '../../helpers/intake';
import { signInAs, type HttpClient } from '../../helpers/session';

const withNote = columnMappingSchema.parse({ memberLabel: 0, x: 1, y: 2, cover: 3, note: 4 });

let sequelize: Sequelize;
beforeAll(() => {
	sequelize = testSequelize();
});
afterAll(async () => {
	await sequelize.close();
});

describe('the import reads what the user chose: units, widths, notes, and what is left over', () => {
	let actor: Actor;
	beforeAll(async () => {
		actor = await actorFor('surveyor@kestrel-lane.example');
	});

	it('refuses a CSV row with more fields than its header, naming the row, and writes nothing', async () => {
		const { survey } = await freshSurvey(actor);
		// Row 3's note has an unquoted comma: "wet, near joint" became two fields, and the
		// import kept "wet" and dropped " near joint" without a word.
		const content = csv([
			'Member,X,Y,Cover,Note',
			'M-01,0,0,30,dry',
			'M-01,100,0,31,wet, near joint',
			'M-02,0,0,32,"quoted, kept whole"'
		]);
		const { outcome } = await importFile(actor, survey.id, 'notes.csv', content, withNote);
		expect(outcome.state).toBe('failed');
		expect(outcome.message).toContain('Row 3: the row has 6 fields but the header has 5');
		expect(await countReadings(sequelize, { surveyId: survey.id })).toBe(0);
	});

	it('keeps a quoted delimiter in the note, and shows imported notes on the member page', async () => {
		const { survey, members } = await freshSurvey(actor);
		const content = csv([
			'Member,X,Y,Cover,Note,',
			'M-01,0,0,30,"wet, near joint",',
			'M-01,100,0,31,,'
		]);
		const { outcome } = await importFile(actor, survey.id, 'notes-ok.csv', content, withNote);
		expect(outcome.state).toBe('completed');
		const member = await Member.findByPk(members[0].id);
		const view = await memberView(member!);
		expect(view.readings.map((r) => r.note)).toEqual(['wet, near joint', null]);
	});

	it('reads "Position (m)" in metres when the preview suggests it, the cover still in mm', async () => {
		const { survey, members } = await freshSurvey(actor);
		const content = csv([
			'Member,Position (m),Height (m),Cover (mm)',
			'M-01,1.25,0.035,31.5',
			'M-01,2.5,0.4,30'
		]);
		const upload = await receiveUpload(
			actor,
			survey.id,
			'metres.csv',
			Readable.from([Buffer.from(content)])
		);
		expect(upload.preview.suggestedMapping).toMatchObject({ x: 1, y: 2, cover: 3 });
		expect(upload.preview.suggestedUnits).toEqual({ x: 'm', y: 'm', cover: 'mm' });
		const { outcome } = await importFile(actor, survey.id, 'metres-2.csv', content, undefined, {
			columnUnits: upload.preview.suggestedUnits
		});
		expect(outcome.state).toBe('completed');
		const view = await memberView((await Member.findByPk(members[0].id))!);
		expect(view.readings.map((r) => [r.xMm, r.yMm, r.coverMm])).toEqual([
			[1250, 35, 31.5],
			[2500, 400, 30]
		]);
	});

	it('expires previews left pending for more than a day on the next upload, and no sooner', async () => {
		const { survey } = await freshSurvey(actor);
		const upload = (name: string, body: string) =>
			receiveUpload(actor, survey.id, name, Readable.from([Buffer.from(body)]));
		const old = await upload('old.csv', csv(['Member,X,Y,Cover', 'M-01,0,0,30']));
		const recent = await upload('recent.csv', csv(['Member,X,Y,Cover', 'M-01,0,0,31']));
		const age = async (batchId: number, hours: number) =>
			sequelize.query(
				'UPDATE import_batches SET created_at = NOW() - INTERVAL ? HOUR WHERE id = ?',
				{ replacements: [hours, batchId], type: QueryTypes.UPDATE }
			);
		await age(old.batchId, 25);
		await age(recent.batchId, 23);
		await upload('next.csv', csv(['Member,X,Y,Cover', 'M-01,0,0,32']));
		const [oldBatch, recentBatch] = await Promise.all([
			ImportBatch.findByPk(old.batchId),
			ImportBatch.findByPk(recent.batchId)
		]);
		expect(oldBatch).toMatchObject({ state: 'cancelled', errorMessage: EXPIRED_MESSAGE });
		expect(EXPIRED_MESSAGE).toContain('24 hours');
		expect(recentBatch!.state).toBe('pending');
	});

	it('links a failed import from the dashboard, and drops it once the same file name imports', async () => {
		const { survey } = await freshSurvey(actor);
		const bad = csv(['Member,X,Y,Cover', 'M-01,0,0,30', 'M-09,0,0,31']);
		const failed = await importFile(actor, survey.id, 'deck.csv', bad);
		expect(failed.outcome.state).toBe('failed');
		const listed = (await dashboardFor(actor)).failedImports.find((b) => b.id === failed.batch.id);
		expect(listed?.href).toBe(`/surveys/${survey.id}#import-${failed.batch.id}`);
		// Another file's success does not make this one good.
		await importFile(actor, survey.id, 'other.csv', csv(['Member,X,Y,Cover', 'M-02,0,0,30']));
		const stillThere = (await dashboardFor(actor)).failedImports.map((b) => b.id);
		expect(stillThere).toContain(failed.batch.id);
		const fixed = csv(['Member,X,Y,Cover', 'M-01,0,0,30', 'M-03,0,0,31']);
		expect((await importFile(actor, survey.id, 'deck.csv', fixed)).outcome.state).toBe('completed');
		const after = (await dashboardFor(actor)).failedImports.map((b) => b.id);
		expect(after).not.toContain(failed.batch.id);
	});
});

describe('the preview read as the import will read it, over HTTP', () => {
	let surveyor: HttpClient;
	let actor: Actor;
	beforeAll(async () => {
		surveyor = await signInAs('surveyor');
		actor = await actorFor('surveyor@kestrel-lane.example');
	});

	it('answers each preview row in mm with the chosen units, or the reason it would be refused', async () => {
		const { survey } = await freshSurvey(actor);
		const content = csv([
			'Member,Position (m),Height (m),Cover (mm),Note',
			'M-01,1.25,0.4,31.5,ok',
			'M-01,2.5,0.4,30,wet, near joint',
			'M-07,3,0.4,30,unknown member'
		]);
		const response = await fetch(
			`${appUrl()}/api/v1/surveys/${survey.id}/imports?fileName=check.csv`,
			{
				method: 'POST',
				headers: {
					cookie: surveyor.cookie,
					origin: new URL(appUrl()).origin,
					accept: 'application/json',
					'content-type': 'text/csv'
				},
				body: content
			}
		);
		expect(response.status).toBe(201);
		const { batchId, preview } = await response.json();
		const { mixedDecimalMarks: _mixed, ...settings } = preview.settings;
		const check = await surveyor.postJson(`/api/v1/imports/${batchId}/check`, {
			mapping: { memberLabel: 0, x: 1, y: 2, cover: 3, note: 4 },
			options: { ...settings, columnUnits: preview.suggestedUnits },
			headers: preview.headers,
			rows: preview.rows
		});
		expect(check.status).toBe(200);
		const { rows } = await check.json();
		expect(rows[0]).toEqual({
			ok: true,
			reading: {
				memberLabel: 'M-01',
				xMm: 1250,
				yMm: 400,
				coverMm: 31.5,
				barDiameterMm: null,
				barSpacingMm: null,
				barDirection: null,
				note: 'ok'
			}
		});
		expect(rows[1]).toMatchObject({ ok: false });
		expect(rows[1].reason).toContain('6 fields but the header has 5');
		expect(rows[2].reason).toContain('member label "M-07" is not a member');
		// Nothing was written by looking.
		const status = await surveyor.get(`/api/v1/imports/${batchId}`);
		expect((await status.json()).import.state).toBe('pending');
	});
});
