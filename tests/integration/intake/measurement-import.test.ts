import type { Sequelize } from 'sequelize';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { AuditEvent } from '../../../src/lib/server/db/models';
import type { Actor } from '../../../src/lib/server/policy';
import { appUrl } from '../../helpers/env';
import { actorFor, csv, freshSurvey, testSequelize } from '../../helpers/intake';
import { signInAs, type HttpClient } from '../../helpers/session';
import { buildXlsx, sheetXml } from '../../helpers/xlsx';

const XLSX_TYPE = 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet';
const CHLORIDE_HEADER = 'Member,Profile,Date,From (mm),To (mm),Chloride (%),Basis';
const CHLORIDE_MAPPING = {
	memberLabel: 0,
	label: 1,
	testedOn: 2,
	fromMm: 3,
	toMm: 4,
	chloridePercent: 5,
	basis: 6
};

describe('carbonation tests and chloride profiles through the import path, over HTTP', () => {
	let sequelize: Sequelize;
	let surveyor: HttpClient;
	let actor: Actor;
	beforeAll(async () => {
		sequelize = testSequelize();
		surveyor = await signInAs('surveyor');
		actor = await actorFor('surveyor@kestrel-lane.example');
	});
	afterAll(async () => {
		await sequelize.close();
	});

	async function upload(surveyId: number, kind: string, name: string, body: string | Buffer) {
		const response = await fetch(
			`${appUrl()}/api/v1/surveys/${surveyId}/imports?kind=${kind}&fileName=${name}`,
			{
				method: 'POST',
				headers: {
					cookie: surveyor.cookie,
					origin: new URL(appUrl()).origin,
					accept: 'application/json',
					'content-type': typeof body === 'string' ? 'text/csv' : XLSX_TYPE
				},
				body: typeof body === 'string' ? body : new Uint8Array(body)
			}
		);
		expect(response.status).toBe(201);
		return response.json();
	}

	async function importAndWait(
		surveyId: number,
		kind: string,
		name: string,
		body: string | Buffer,
		mapping: Record<string, number>
	) {
		const { batchId, preview } = await upload(surveyId, kind, name, body);
		const { mixedDecimalMarks: _mixed, ...settings } = preview.settings;
		const started = await surveyor.postJson(`/api/v1/imports/${batchId}/start`, {
			mapping,
			options: settings
		});
		expect(started.status).toBe(202);
		for (let i = 0; i < 200; i++) {
			const status = (await (await surveyor.get(`/api/v1/imports/${batchId}`)).json()).import;
			if (status.state !== 'running') return { batchId, preview, status };
			await new Promise((r) => setTimeout(r, 100));
		}
		throw new Error('the import did not settle');
	}

	const profilesOf = async (memberId: number) =>
		(await (await surveyor.get(`/api/v1/members/${memberId}/chloride-profiles`)).json())
			.chlorideProfiles;

	it('imports chloride profiles, one increment a row, and undoes exactly them', async () => {
		const { survey, members } = await freshSurvey(actor);
		const content = csv([
			CHLORIDE_HEADER,
			// Rows out of depth order: the import sorts a profile's increments from the surface.
			'M-01,P1,2026-02-10,5,10,0.48,binder',
			'M-01,P1,2026-02-10,0,5,0.62,binder',
			'M-01,P1,2026-02-10,10,20,0.30,binder',
			'M-01,P2,2026-02-10,0,5,0.55,binder',
			'M-01,P2,2026-02-10,5,15,0.35,binder',
			'M-02,P1,2026-02-11,0,5,0.41,binder'
		]);
		const { batchId, preview, status } = await importAndWait(
			survey.id,
			'chloride',
			'profiles.csv',
			content,
			CHLORIDE_MAPPING
		);
		expect(preview.suggestedMapping).toEqual(CHLORIDE_MAPPING);
		expect(status).toMatchObject({ state: 'completed', kind: 'chloride', rowsImported: 6 });
		const onFirst = await profilesOf(members[0].id);
		expect(onFirst.map((p: { label: string }) => p.label)).toEqual(['P1', 'P2']);
		expect(onFirst[0].increments).toEqual([
			{ fromMm: 0, toMm: 5, chloridePercent: 0.62, percentOfBinder: 0.62, outermost: true },
			{ fromMm: 5, toMm: 10, chloridePercent: 0.48, percentOfBinder: 0.48, outermost: false },
			{ fromMm: 10, toMm: 20, chloridePercent: 0.3, percentOfBinder: 0.3, outermost: false }
		]);
		expect(await profilesOf(members[1].id)).toHaveLength(1);
		const audit = await AuditEvent.findOne({
			where: { action: 'import.completed', subjectType: 'import_batch', subjectId: batchId }
		});
		expect(audit).not.toBeNull();
		const undo = await surveyor.postJson(`/api/v1/imports/${batchId}/undo`, {});
		expect(undo.status).toBe(200);
		expect((await undo.json()).rowsDeleted).toBe(3);
		expect(await profilesOf(members[0].id)).toEqual([]);
		expect(await profilesOf(members[1].id)).toEqual([]);
	});

	it('refuses the whole file when one row is wrong, naming the row, and writes nothing', async () => {
		const { survey, members } = await freshSurvey(actor);
		const content = csv([
			CHLORIDE_HEADER,
			'M-01,P1,2026-02-10,0,5,0.62,binder',
			'M-01,P1,2026-02-10,5,10,0.48,binder',
			// Row 4: the to-depth is above the from-depth.
			'M-01,P1,2026-02-10,20,10,0.30,binder',
			'M-02,P1,2026-02-10,0,5,0.41,binder'
		]);
		const { status } = await importAndWait(
			survey.id,
			'chloride',
			'bad.csv',
			content,
			CHLORIDE_MAPPING
		);
		expect(status.state).toBe('failed');
		expect(status.errorMessage).toContain('Row 4: profile "P1" on M-01: Increment 3 (20–10 mm)');
		expect(status.errorMessage).toContain('nothing was imported');
		expect(status.hasRejectedRows).toBe(true);
		expect(await profilesOf(members[0].id)).toEqual([]);
		expect(await profilesOf(members[1].id)).toEqual([]);
	});

	it('imports carbonation tests from an XLSX sheet, its dates as spreadsheet serial numbers', async () => {
		const { survey, members } = await freshSurvey(actor);
		const workbook = buildXlsx([
			{
				name: 'Carbonation',
				xml: sheetXml([
					{ cells: ['Member', 'Location', 'Date', 'Depths (mm)', 'Method'] },
					// 46063 days after 1899-12-30 is 2026-02-10 (the 1900 date system).
					{ cells: ['M-01', 'CT1', 46063, '8;11;9.5', 'phenolphthalein, split core'] },
					{ cells: ['M-01', 'CT2', 46063, '12 14', 'phenolphthalein, split core'] },
					{ cells: ['M-03', 'CT1', 46064, 7, 'phenolphthalein, drilled face'] }
				])
			}
		]);
		const { preview, status } = await importAndWait(
			survey.id,
			'carbonation',
			'carbonation.xlsx',
			workbook,
			{ memberLabel: 0, label: 1, testedOn: 2, depths: 3, method: 4 }
		);
		expect(preview.format).toBe('xlsx');
		expect(preview.suggestedMapping).toMatchObject({
			memberLabel: 0,
			label: 1,
			testedOn: 2,
			depths: 3,
			method: 4
		});
		expect(status).toMatchObject({ state: 'completed', kind: 'carbonation', rowsImported: 3 });
		const tests = (
			await (await surveyor.get(`/api/v1/members/${members[0].id}/carbonation-tests`)).json()
		).carbonationTests;
		expect(
			tests.map((t: { label: string; testedOn: string; depthsMm: number[] }) => [
				t.label,
				t.testedOn,
				t.depthsMm
			])
		).toEqual([
			['CT1', '2026-02-10', [8, 11, 9.5]],
			['CT2', '2026-02-10', [12, 14]]
		]);
	});
});
