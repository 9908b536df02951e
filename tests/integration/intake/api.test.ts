import type { Sequelize } from 'sequelize';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { AuditEvent } from '../../../src/lib/server/db/models';
import type { Actor } from '../../../src/lib/server/policy';
import { signUpNewOrganisation } from '../../helpers/accounts';
import { appUrl } from '../../helpers/env';
import { actorFor, countReadings, csv, freshSurvey, testSequelize } from '../../helpers/intake';
import { addReadings } from '../../helpers/readings';
import { signInAs, type HttpClient } from '../../helpers/session';

const HEADER = 'Member,X,Y,Cover';

async function upload(client: HttpClient, surveyId: number, body: string | Buffer, name = 'r.csv') {
	return fetch(
		`${appUrl()}/api/v1/surveys/${surveyId}/imports?fileName=${encodeURIComponent(name)}`,
		{
			method: 'POST',
			headers: {
				cookie: client.cookie,
				origin: new URL(appUrl()).origin,
				accept: 'application/json',
				'content-type': 'text/csv'
			},
			body: typeof body === 'string' ? body : new Uint8Array(body)
		}
	);
}

async function waitUntilSettled(client: HttpClient, batchId: number) {
	for (let i = 0; i < 300; i++) {
		const status = (await (await client.get(`/api/v1/imports/${batchId}`)).json()).import;
		if (status.state !== 'running') return status;
		await new Promise((r) => setTimeout(r, 100));
	}
	throw new Error('the import did not settle');
}

describe('intake API over HTTP (the built app, the real database)', () => {
	let sequelize: Sequelize;
	let surveyor: HttpClient;
	let actor: Actor;
	beforeAll(async () => {
		sequelize = testSequelize();
		actor = await actorFor('surveyor@kestrel-lane.example');
		surveyor = await signInAs('surveyor');
	});
	afterAll(async () => {
		await sequelize.close();
	});

	it('uploads, previews, imports with progress, returns rejected rows as CSV, and undoes', async () => {
		const { survey } = await freshSurvey(actor);
		const response = await upload(
			surveyor,
			survey.id,
			csv([HEADER, 'M-01,0,0,31', 'M-02,0,0,=cmd()', 'M-03,0,0,29'])
		);
		expect(response.status).toBe(201);
		const uploaded = await response.json();
		expect(uploaded.preview.headers).toEqual(['Member', 'X', 'Y', 'Cover']);
		expect(uploaded.preview.suggestedMapping).toMatchObject({
			memberLabel: 0,
			x: 1,
			y: 2,
			cover: 3
		});
		const { mixedDecimalMarks: _m, ...settings } = uploaded.preview.settings;
		const start = await surveyor.postJson(`/api/v1/imports/${uploaded.batchId}/start`, {
			mapping: uploaded.preview.suggestedMapping,
			options: { ...settings, failingRows: 'import-valid' }
		});
		expect(start.status).toBe(202);
		const status = await waitUntilSettled(surveyor, uploaded.batchId);
		expect(status).toMatchObject({
			state: 'completed',
			rowsImported: 2,
			rowsRejected: 1,
			hasRejectedRows: true
		});
		const rejected = await surveyor.get(`/api/v1/imports/${uploaded.batchId}/rejected`);
		expect(rejected.headers.get('content-type')).toContain('text/csv');
		const text = await rejected.text();
		// The formula is neutralised for spreadsheets, and the reason names the row and field.
		expect(text).toContain(`3,"cover ""=cmd()"" is not a number",M-02,0,0,'=cmd()\r\n`);
		const undo = await surveyor.postJson(`/api/v1/imports/${uploaded.batchId}/undo`, {});
		expect(await undo.json()).toEqual({ rowsDeleted: 2 });
		expect(await countReadings(sequelize, { surveyId: survey.id })).toBe(0);
	});

	it('answers a bad start body with the field named, and an over-limit file with a clear 413', async () => {
		const { survey } = await freshSurvey(actor);
		const uploaded = await (await upload(surveyor, survey.id, csv([HEADER, 'M-01,0,0,31']))).json();
		const bad = await surveyor.postJson(`/api/v1/imports/${uploaded.batchId}/start`, {
			mapping: { memberLabel: 0 },
			options: {}
		});
		expect(bad.status).toBe(400);
		expect(await bad.json()).toEqual({
			error: {
				code: 'invalid_input',
				message: 'Choose the column that holds the cover.',
				field: 'mapping.cover'
			}
		});
		const big = await upload(surveyor, survey.id, Buffer.alloc(61 * 1024 * 1024, 0x41));
		expect(big.status).toBe(413);
		expect((await big.json()).error.message).toBe(
			'The file is larger than the 60 MB limit for one import; split it into smaller files.'
		);
	});

	it('refuses to submit a survey without readings, saying why, and leaves it a draft', async () => {
		const { survey } = await freshSurvey(actor);
		const refused = await surveyor.postJson(`/api/v1/surveys/${survey.id}/submit`, {});
		expect(refused.status).toBe(409);
		expect((await refused.json()).error.message).toBe(
			'The survey has no readings yet: enter or import readings before submitting it for review.'
		);
		await survey.reload();
		expect(survey.status).toBe('draft');
	});

	it('moves a survey draft → submitted → returned → submitted → approved, audited, readings frozen', async () => {
		const { survey, members } = await freshSurvey(actor);
		await addReadings(survey.id, members[0].id, [{ xMm: 0, yMm: 0, coverMm: 31 }]);
		const engineer = await signInAs('engineer');
		expect((await surveyor.postJson(`/api/v1/surveys/${survey.id}/submit`, {})).status).toBe(200);
		const frozen = await upload(surveyor, survey.id, csv([HEADER, 'M-01,0,0,31']));
		expect(frozen.status).toBe(409);
		expect((await frozen.json()).error.message).toMatch(/frozen/);
		expect(
			(await surveyor.postJson(`/api/v1/surveys/${survey.id}/review`, { decision: 'approve' }))
				.status
		).toBe(403);
		const noComment = await engineer.postJson(`/api/v1/surveys/${survey.id}/review`, {
			decision: 'return',
			comment: ''
		});
		expect((await noComment.json()).error.field).toBe('comment');
		const returned = await engineer.postJson(`/api/v1/surveys/${survey.id}/review`, {
			decision: 'return',
			comment: 'Bay 3 is missing.'
		});
		expect((await returned.json()).survey).toMatchObject({
			status: 'returned',
			statusComment: 'Bay 3 is missing.'
		});
		await surveyor.postJson(`/api/v1/surveys/${survey.id}/submit`, {});
		const approved = await engineer.postJson(`/api/v1/surveys/${survey.id}/review`, {
			decision: 'approve'
		});
		expect((await approved.json()).survey.status).toBe('approved');
		const events = await AuditEvent.findAll({
			where: { subjectType: 'survey', subjectId: String(survey.id) },
			order: [['id', 'ASC']]
		});
		expect(events.map((e) => e.action)).toEqual([
			'survey.submitted',
			'survey.returned',
			'survey.submitted',
			'survey.approved'
		]);
	});

	it('creates members from a pasted table all or none, with duplicate labels named', async () => {
		const { survey } = await freshSurvey(actor, ['B-01']);
		const table =
			'label\ttype\tface\texposure\tbar diameter\nB-02\tbeam\tbottom\tXC3\t16\nb-01\tbeam\tbottom\tXC3\t16\nB-03\tbeam\tside\tXD1\t12';
		const clash = await surveyor.postJson(`/api/v1/surveys/${survey.id}/members/bulk`, { table });
		expect(clash.status).toBe(400);
		expect((await clash.json()).error.message).toContain(
			'Row 3: label "b-01" is already used by an existing member.'
		);
		const ok = await surveyor.postJson(`/api/v1/surveys/${survey.id}/members/bulk`, {
			table: table.replace('b-01', 'B-04')
		});
		expect(await ok.json()).toEqual({ created: 3 });
		const members = (await (await surveyor.get(`/api/v1/surveys/${survey.id}/members`)).json())
			.members;
		// EN 1992-1-1 Table 4.4N, S4: XC3 → c_min,dur 25 mm; XD1 → 35 mm; c_nom = c_min + 10 mm.
		expect(members.find((m: { label: string }) => m.label === 'B-02')).toMatchObject({
			cMinMm: 25,
			cNomMm: 35
		});
		expect(members.find((m: { label: string }) => m.label === 'B-03')).toMatchObject({
			cMinMm: 35,
			cNomMm: 45
		});
	});

	it('hides another organisation’s records (404) and refuses roles without the right (403)', async () => {
		const { survey, members } = await freshSurvey(actor);
		const stranger = (await signUpNewOrganisation('intake-stranger')).client;
		for (const path of [
			`/api/v1/surveys/${survey.id}`,
			`/api/v1/surveys/${survey.id}/members`,
			`/api/v1/members/${members[0].id}/holes`,
			`/api/v1/surveys/${survey.id}/imports`
		]) {
			const response = await stranger.get(path);
			expect(response.status, path).toBe(404);
		}
		const upload404 = await upload(stranger, survey.id, csv([HEADER, 'M-01,0,0,31']));
		expect(upload404.status).toBe(404);
		const owner = await signInAs('owner');
		expect((await upload(owner, survey.id, csv([HEADER, 'M-01,0,0,31']))).status).toBe(403);
		const hole = await surveyor.postJson(`/api/v1/members/${members[0].id}/holes`, {
			label: 'H1',
			meterReadingMm: 31,
			measuredCoverMm: 33
		});
		expect(hole.status).toBe(201);
	});

	it('answers a path id that is not an id with 404 for GET and POST alike', async () => {
		// A path that names no record is a 404 whatever the method: the id is not a field the
		// caller filled in (web/params.ts).
		for (const bad of ['abc', '0', '12abc', '99999999999']) {
			const path = `/api/v1/surveys/${bad}/members`;
			const read = await surveyor.get(path);
			expect(read.status, `GET ${path}`).toBe(404);
			expect((await read.json()).error.code, `GET ${path}`).toBe('not_found');
			const write = await surveyor.postJson(path, { label: 'M-01' });
			expect(write.status, `POST ${path}`).toBe(404);
			expect((await write.json()).error.code, `POST ${path}`).toBe('not_found');
		}
	});

	it('saves grid readings for one member all or none', async () => {
		const { members } = await freshSurvey(actor);
		const bad = await surveyor.postJson(`/api/v1/members/${members[0].id}/readings`, {
			rows: [{ cover: '31' }, { cover: '-2' }]
		});
		expect(bad.status).toBe(400);
		expect((await bad.json()).error.message).toContain('cover -2 mm is negative');
		const good = await surveyor.postJson(`/api/v1/members/${members[0].id}/readings`, {
			rows: [
				{ x: '0', cover: '31' },
				{ x: '150', cover: '30.5' }
			]
		});
		expect((await good.json()).rowsImported).toBe(2);
	});

	it('numbers grid rows as the grid does, in the message, the reason for a repeat and the rejected rows', async () => {
		// The grid's rows reach the row checks as cells: no header line shifts their numbers, so
		// a repeat of the first reading names row 1 (it named its own row when the grid went
		// through CSV text under a header).
		const { members, survey } = await freshSurvey(actor);
		const response = await surveyor.postJson(`/api/v1/members/${members[0].id}/readings`, {
			rows: [
				{ x: '0', y: '0', cover: '31', note: 'left, =1+1' },
				{ x: '0', y: '0', cover: '31', note: 'left, =1+1' },
				{ x: '150', y: '0', cover: 'thirty' }
			]
		});
		expect(response.status).toBe(400);
		const message: string = (await response.json()).error.message;
		expect(message).toMatch(/^2 of 3 rows failed the checks/);
		expect(message).toContain(
			'Grid row 2: exact duplicate of row 1 (and 1 more row with problems).'
		);
		expect(message).not.toMatch(/\bRow \d/);
		expect(await countReadings(sequelize, { surveyId: survey.id })).toBe(0);
		const batches = (await (await surveyor.get(`/api/v1/surveys/${survey.id}/imports`)).json())
			.imports as { id: number }[];
		const rejected = await surveyor.get(`/api/v1/imports/${batches[0].id}/rejected`);
		const lines = (await rejected.text()).trim().split('\r\n');
		expect(lines[0]).toBe('row,reason,memberLabel,x,y,cover,diameter,direction,note');
		expect(lines[1]).toBe(`2,exact duplicate of row 1,${members[0].label},0,0,31,,,"left, '=1+1"`);
		expect(lines[2]).toMatch(new RegExp(`^3,.*,${members[0].label},150,0,thirty,,,$`));
	});
});
