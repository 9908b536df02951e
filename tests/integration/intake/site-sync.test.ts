/**
 * A device's queued site entries sent to /api/v1/surveys/:id/site-sync over HTTP against the
 * built app and the real database: written once per batch id however often the batch is sent,
 * two identical sends at the same moment included; refused with the reason once the survey is
 * submitted; checked by the entry grid's own row checks.
 */
import { randomUUID } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { ImportBatch, SyncBatch, VerificationHole } from '../../../src/lib/server/db/models';
import { readCoverCounts } from '../../../src/lib/server/readings/coverSets';
import { asDemoSurveyor, submitSurvey } from '../../helpers/editing';
import { countReadings, freshSurvey } from '../../helpers/intake';
import { anonymousClient } from '../../helpers/session';

function batchOf(memberIds: number[], readingsPerMember: number, holes = 0) {
	return {
		batchId: randomUUID(),
		readings: memberIds.flatMap((memberId, m) =>
			Array.from({ length: readingsPerMember }, (_, i) => ({
				memberId,
				clientId: randomUUID(),
				x: String(100 * i),
				y: String(50 * m),
				cover: (25 + ((i * 7) % 20) + m / 10).toFixed(1),
				diameter: '12',
				direction: 'x',
				note: ''
			}))
		),
		holes: Array.from({ length: holes }, (_, i) => ({
			memberId: memberIds[0],
			clientId: randomUUID(),
			label: `S${i + 1}`,
			meterReadingMm: '31',
			measuredCoverMm: '33.5',
			method: 'drilled'
		}))
	};
}

describe('/api/v1/surveys/:id/site-sync (the built app, the real database)', () => {
	const session = asDemoSurveyor();

	it('writes a batch once: a second send of the same batch id adds nothing', async () => {
		const { survey, members } = await freshSurvey(session.actor, ['S-01', 'S-02']);
		const batch = batchOf(
			members.map((m) => m.id),
			6,
			1
		);
		const first = await session.surveyor.postJson(`/api/v1/surveys/${survey.id}/site-sync`, batch);
		expect(first.status).toBe(201);
		expect(await first.json()).toMatchObject({ received: 'now', readings: 12, holes: 1 });
		expect(await countReadings(session.sequelize, { surveyId: survey.id })).toBe(12);

		const again = await session.surveyor.postJson(`/api/v1/surveys/${survey.id}/site-sync`, batch);
		expect(again.status).toBe(200);
		expect(await again.json()).toMatchObject({ received: 'earlier', readings: 12, holes: 1 });
		expect(await countReadings(session.sequelize, { surveyId: survey.id })).toBe(12);
		expect(await VerificationHole.count({ where: { memberId: members[0].id } })).toBe(1);
		// The members' cover counts follow the readings (DEVELOPERS.md: they go together).
		const counts = await readCoverCounts(members.map((m) => m.id));
		expect(members.map((m) => counts.get(m.id)?.n)).toEqual([6, 6]);
	});

	it('of two identical sends at the same moment, exactly one writes', async () => {
		const { survey, members } = await freshSurvey(session.actor, ['C-01']);
		const batch = batchOf([members[0].id], 200, 2);
		const path = `/api/v1/surveys/${survey.id}/site-sync`;
		const answers = await Promise.all([
			session.surveyor.postJson(path, batch),
			session.surveyor.postJson(path, batch)
		]);
		const statuses = answers.map((a) => a.status).sort();
		expect(statuses).toEqual([200, 201]);
		const bodies = await Promise.all(answers.map((a) => a.json()));
		expect(bodies.map((b) => b.received).sort()).toEqual(['earlier', 'now']);
		expect(await countReadings(session.sequelize, { surveyId: survey.id })).toBe(200);
		expect(await VerificationHole.count({ where: { memberId: members[0].id } })).toBe(2);
		expect(await SyncBatch.count({ where: { surveyId: survey.id } })).toBe(1);
		expect(await ImportBatch.count({ where: { surveyId: survey.id, state: 'completed' } })).toBe(1);
	});

	it('refuses a batch for a submitted survey with the reason, and writes nothing', async () => {
		const { survey, members } = await freshSurvey(session.actor, ['F-01']);
		// Submitting needs a reading: the helper enters one first.
		await submitSurvey(session.surveyor, survey.id);
		const before = await countReadings(session.sequelize, { surveyId: survey.id });
		const response = await session.surveyor.postJson(
			`/api/v1/surveys/${survey.id}/site-sync`,
			batchOf([members[0].id], 3)
		);
		expect(response.status).toBe(409);
		expect((await response.json()).error.message).toMatch(/survey is submitted.*frozen/);
		expect(await countReadings(session.sequelize, { surveyId: survey.id })).toBe(before);
		expect(await SyncBatch.count({ where: { surveyId: survey.id } })).toBe(0);
	});

	it('checks readings as the entry grid does, naming the row, and keeps the batch id free', async () => {
		const { survey, members } = await freshSurvey(session.actor, ['B-01']);
		const batch = batchOf([members[0].id], 3);
		batch.readings[1].cover = 'thirty';
		const path = `/api/v1/surveys/${survey.id}/site-sync`;
		const response = await session.surveyor.postJson(path, batch);
		expect(response.status).toBe(400);
		expect((await response.json()).error.message).toMatch(/Grid row 2/);
		expect(await countReadings(session.sequelize, { surveyId: survey.id })).toBe(0);
		// Corrected, the same batch id goes through: a refusal did not take it.
		batch.readings[1].cover = '30';
		expect((await session.surveyor.postJson(path, batch)).status).toBe(201);
		expect(await countReadings(session.sequelize, { surveyId: survey.id })).toBe(3);
	});

	it('refuses a member of another survey, and a session that has ended', async () => {
		const { survey } = await freshSurvey(session.actor, ['O-01']);
		const other = await freshSurvey(session.actor, ['O-02']);
		const path = `/api/v1/surveys/${survey.id}/site-sync`;
		const stray = await session.surveyor.postJson(path, batchOf([other.members[0].id], 1));
		expect(stray.status).toBe(400);
		expect((await stray.json()).error.message).toMatch(/not a member of this survey/);
		const signedOut = await anonymousClient().postJson(path, batchOf([other.members[0].id], 1));
		expect(signedOut.status).toBe(401);
	});

	it('stores a photo once per client id', async () => {
		const { survey, members } = await freshSurvey(session.actor, ['P-01']);
		// A 1×1 PNG (the smallest valid image: signature, IHDR, IDAT, IEND).
		const png = Buffer.from(
			'iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mP8z8BQDwAEhQGAhKmMIQAAAABJRU5ErkJggg==',
			'base64'
		);
		const clientId = randomUUID();
		const path = `/api/v1/surveys/${survey.id}/site-sync/photos?clientId=${clientId}&memberId=${members[0].id}&fileName=spot.png&caption=bay%203`;
		const first = await session.surveyor.postBody(path, png, 'image/png');
		expect(first.status).toBe(201);
		const again = await session.surveyor.postBody(path, png, 'image/png');
		expect(again.status).toBe(200);
		const rows = await SyncBatch.findAll({ where: { surveyId: survey.id, kind: 'photo' } });
		expect(rows).toHaveLength(1);
		expect(rows[0].attachmentId).toBe((await first.json()).attachmentId);
	});
});
