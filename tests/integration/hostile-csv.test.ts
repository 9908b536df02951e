/**
 * Hostile input in CSV downloads: a reading file whose cells are spreadsheet formulas is
 * imported; the rejected-rows CSV gives those cells back with a leading apostrophe, so that a
 * spreadsheet shows them as text instead of running them (src/lib/csv.ts).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Sequelize } from 'sequelize';
import { testSequelize } from '../helpers/database';
import { appUrl } from '../helpers/env';
import { createOtherOrganisation, type OtherOrganisation } from '../helpers/otherOrganisation';

const FORMULAS = ['=1+1', "-2+3+cmd|' /C calc'!A0", '+SUM(A1)', '@SUM(A1)', '=HYPERLINK("x")'];

let sequelize: Sequelize;
let org: OtherOrganisation;
let rejectedCsv: string;

async function importFile(text: string): Promise<number> {
	const staged = await fetch(
		new URL(`/api/v1/surveys/${org.ids.surveyId}/imports?fileName=formulas.csv`, appUrl()),
		{
			method: 'POST',
			body: text,
			headers: {
				cookie: org.admin.cookie,
				'content-type': 'text/csv',
				origin: new URL(appUrl()).origin
			}
		}
	);
	expect(staged.status).toBe(201);
	const upload = await staged.json();
	const { mixedDecimalMarks: _mixed, ...options } = upload.preview.settings;
	void _mixed;
	const started = await org.admin.postJson(`/api/v1/imports/${upload.batchId}/start`, {
		mapping: { memberLabel: 0, x: 1, y: 2, cover: 3 },
		options,
		confirmDuplicate: true
	});
	expect(started.status).toBe(202);
	for (let i = 0; i < 100; i++) {
		const state = (await (await org.admin.get(`/api/v1/imports/${upload.batchId}`)).json()).import
			.state;
		if (state !== 'running' && state !== 'pending') return upload.batchId;
		await new Promise((r) => setTimeout(r, 100));
	}
	throw new Error('the import did not finish');
}

beforeAll(async () => {
	sequelize = testSequelize();
	org = await createOtherOrganisation(sequelize);
	const label = `HOSTILE-${org.ids.marker}`;
	const rows = FORMULAS.map((f, i) => `${f},${i},0,${f}`);
	const batchId = await importFile(
		['Member,X (mm),Y (mm),Cover (mm)', `${label},0,0,40.5`, ...rows].join('\r\n') + '\r\n'
	);
	const response = await org.admin.get(`/api/v1/imports/${batchId}/rejected`);
	expect(response.status).toBe(200);
	rejectedCsv = await response.text();
});

afterAll(async () => {
	await sequelize.close();
});

describe('the rejected-rows CSV', () => {
	it('lists each formula row', () => {
		for (const f of FORMULAS) expect(rejectedCsv).toContain(`'${f}`.replaceAll('"', '""'));
	});

	it('has no cell that a spreadsheet would run as a formula', () => {
		const cells = rejectedCsv
			.split(/\r\n/)
			.flatMap((line) => line.split(','))
			.map((cell) => cell.replace(/^"/, ''));
		const live = cells.filter((cell) => /^[=+\-@\t\r]/.test(cell));
		expect(live).toEqual([]);
	});
});
