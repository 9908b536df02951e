import fc from 'fast-check';
import { QueryTypes, type Sequelize } from 'sequelize';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Member } from '../../../src/lib/server/db/models';
import { actorFor, countReadings, freshSurvey, testSequelize } from '../../helpers/intake';
import { signInAs, type HttpClient } from '../../helpers/session';
import { until } from '../../helpers/until';

/*
 * Fuzzing of the intake API through the built app over HTTP (fast-check, seeded): JSON bodies of
 * the entry grid, the pasted member table and the import start, and file bytes for an import.
 * Properties: never a 500; a batch is written whole or not at all. `npm run fuzz` runs longer.
 */
const RUNS = Math.max(5, Math.round(Number(process.env.FUZZ_RUNS ?? 40) / 3));
const SEED = Number(process.env.FUZZ_SEED ?? 20261204);

const token = fc.oneof(
	fc.constantFrom('', '30', '-1', '1e400', '0,5', '#DIV/0!', '=1+1', ' ', 'top', '\t', '"', '\n'),
	fc.string({ maxLength: 8 }),
	fc.double().map(String)
);
const junk = fc.oneof(fc.jsonValue({ maxDepth: 3 }), token);

const gridRow = fc.record(
	{ x: token, y: token, cover: token, diameter: token, direction: token, note: token },
	{ requiredKeys: ['cover'] }
);
const gridBody = fc.oneof(
	fc.record({
		units: fc.constantFrom('mm', 'inch', 'furlong'),
		rows: fc.array(gridRow, { maxLength: 8 })
	}),
	fc.record({ units: junk, rows: fc.oneof(junk, fc.array(junk, { maxLength: 4 })) }),
	junk
);

describe('fuzzing the intake API over HTTP', { timeout: 60_000 + RUNS * 3000 }, () => {
	let sequelize: Sequelize;
	let surveyor: HttpClient;
	let surveyId: number;
	let memberId: number;

	beforeAll(async () => {
		sequelize = testSequelize();
		surveyor = await signInAs('surveyor');
		const { survey } = await freshSurvey(await actorFor('surveyor@kestrel-lane.example'));
		surveyId = survey.id;
		memberId = (await Member.findOne({ where: { surveyId, label: 'M-01' } }))!.id;
	});
	afterAll(async () => {
		await sequelize?.close();
	});

	const memberReadings = async () =>
		Number(
			(
				await sequelize.query<{ n: number }>(
					'SELECT COUNT(*) AS n FROM readings WHERE member_id = ?',
					{
						replacements: [memberId],
						type: QueryTypes.SELECT
					}
				)
			)[0].n
		);

	it('entry grid bodies: never a 500, and the rows are written all or none', async () => {
		await fc.assert(
			fc.asyncProperty(gridBody, async (body) => {
				const before = await memberReadings();
				const response = await surveyor.postJson(`/api/v1/members/${memberId}/readings`, body);
				expect(response.status, await response.clone().text()).toBeLessThan(500);
				const after = await memberReadings();
				const rows = (body as { rows?: unknown[] }).rows;
				if (response.status === 201) expect(after - before).toBe(rows!.length);
				else expect(after).toBe(before);
			}),
			{ seed: SEED, numRuns: RUNS }
		);
	});

	it('pasted member tables: never a 500, and the members are created all or none', async () => {
		const table = fc.oneof(
			fc.array(token, { maxLength: 60 }).map((t) => t.join('')),
			fc
				.array(
					fc.array(fc.oneof(token, fc.constantFrom('slab', 'XC3', 'top', '25')), { maxLength: 6 }),
					{
						minLength: 1,
						maxLength: 5
					}
				)
				.map((rows) => ['label\ttype\tface\texposure', ...rows.map((r) => r.join('\t'))].join('\n'))
		);
		await fc.assert(
			fc.asyncProperty(
				fc.oneof(
					table.map((t) => ({ table: t })),
					junk
				),
				async (body) => {
					const before = await Member.count({ where: { surveyId } });
					const response = await surveyor.postJson(
						`/api/v1/surveys/${surveyId}/members/bulk`,
						body
					);
					expect(response.status, await response.clone().text()).toBeLessThan(500);
					const after = await Member.count({ where: { surveyId } });
					if (response.status === 201) expect(after - before).toBe((await response.json()).created);
					else expect(after).toBe(before);
				}
			),
			{ seed: SEED, numRuns: RUNS }
		);
	});

	it('file bytes and import starts: never a 500; an import ends completed with its rows or failed with none', async () => {
		const line = fc
			.array(fc.oneof(token, fc.constantFrom('M-01', 'M-02', '31.5')), { maxLength: 5 })
			.map((cells) =>
				cells.join(fc.sample(fc.constantFrom(',', ';'), { seed: SEED, numRuns: 1 })[0])
			);
		const file = fc.oneof(
			fc
				.array(line, { maxLength: 40 })
				.map((lines) => Buffer.from(['Member,X,Y,Cover', ...lines].join('\n'))),
			fc.uint8Array({ maxLength: 512 }).map((b) => Buffer.from(b))
		);
		const startBody = fc.oneof(
			fc.record({
				mapping: fc.oneof(fc.constant({ memberLabel: 0, x: 1, y: 2, cover: 3 }), junk),
				options: fc.oneof(fc.constant({}), junk),
				confirmDuplicate: fc.boolean()
			}),
			junk
		);
		await fc.assert(
			fc.asyncProperty(file, startBody, async (content, body) => {
				const { survey } = await freshSurvey(await actorFor('surveyor@kestrel-lane.example'));
				const upload = await surveyor.postBody(
					`/api/v1/surveys/${survey.id}/imports?fileName=fuzz.csv`,
					new Uint8Array(content),
					'text/csv'
				);
				expect(upload.status, await upload.clone().text()).toBeLessThan(500);
				if (upload.status !== 201) return;
				const { batchId, preview } = await upload.json();
				const { mixedDecimalMarks: _mixed, ...settings } = preview.settings;
				const merged =
					body && typeof body === 'object' && 'options' in body && typeof body.options === 'object'
						? { ...body, options: { ...settings, ...(body.options as object) } }
						: body;
				const start = await surveyor.postJson(`/api/v1/imports/${batchId}/start`, merged);
				expect(start.status, await start.clone().text()).toBeLessThan(500);
				if (start.status !== 202) return;
				const view = await until(`import ${batchId} to end`, async () => {
					const v = (await (await surveyor.get(`/api/v1/imports/${batchId}`)).json()).import;
					return v.state !== 'running' ? v : null;
				});
				const written = await countReadings(sequelize, { surveyId: survey.id });
				if (view.state === 'completed') expect(written).toBe(view.rowsImported);
				else expect([written, view.state]).toEqual([0, 'failed']);
			}),
			{ seed: SEED, numRuns: RUNS }
		);
	});
});
