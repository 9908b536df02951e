import { QueryTypes, type Sequelize } from 'sequelize';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Member } from '../../../src/lib/server/db/models';
import { actorFor, freshSurvey, importFile, testSequelize } from '../../helpers/intake';
import { signInAs } from '../../helpers/session';

const READINGS = 200_000;

describe('the cover map of a member with 200,000 readings', () => {
	let sequelize: Sequelize;
	let memberId: number;

	beforeAll(async () => {
		sequelize = testSequelize();
		const actor = await actorFor('surveyor@kestrel-lane.example');
		const { survey } = await freshSurvey(actor, ['M-01']);
		const lines = ['Member,X,Y,Cover'];
		// A 10 m × 2 m grid at 10 mm, covers 20.0 … 59.9 mm.
		for (let i = 0; i < READINGS; i++)
			lines.push(`M-01,${(i % 1000) * 10},${Math.floor(i / 1000) * 10},${20 + (i % 400) / 10}`);
		const { outcome } = await importFile(actor, survey.id, 'large.csv', lines.join('\n') + '\n');
		expect(outcome.state).toBe('completed');
		memberId = (await Member.findOne({ where: { surveyId: survey.id } }))!.id;
	}, 180_000);
	afterAll(async () => {
		await sequelize?.close();
	});

	it('arrives binned to its cells: a bounded answer whose cells hold every reading', async () => {
		const engineer = await signInAs('engineer');
		const response = await engineer.get(`/api/v1/members/${memberId}/cover-map`);
		expect(response.status).toBe(200);
		const text = await response.text();
		// The readings themselves were a 26 MB answer at this size; the grid is a few kB.
		expect(text.length).toBeLessThan(200_000);
		console.log(`cover-map answer for ${READINGS} readings: ${text.length} bytes`);
		const view = JSON.parse(text);
		const map = view.coverMap;
		expect(map.columns * map.rows).toBeLessThanOrEqual(36 * 36);
		expect(map.cells.length).toBeLessThanOrEqual(map.columns * map.rows);
		let counted = 0;
		let least = Infinity;
		for (const cell of map.cells) {
			counted += cell.count;
			least = Math.min(least, cell.leastMm);
		}
		expect(counted).toBe(READINGS);
		const [sql] = await sequelize.query<{ least: number }>(
			'SELECT MIN(cover_mm) AS least FROM readings WHERE member_id = ?',
			{ replacements: [memberId], type: QueryTypes.SELECT }
		);
		expect(least).toBe(Number(sql.least));
		expect(map.rangeMm[0]).toBe(Number(sql.least));
		expect(view.readingsTotal).toBe(READINGS);
		expect(view.readings.length).toBe(1000);
	});
});
