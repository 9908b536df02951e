import { QueryTypes, type Sequelize } from 'sequelize';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { db, closeDb, Assessment, Member } from '../../src/lib/server/db';
import { methodSchema } from '../../src/lib/server/populations';
import { approve, saveDraft, sha256Hex } from '../../src/lib/server/assessments';
import { loadOr404 } from '../../src/lib/server/web/pages';
import { ADMIN, CAR_PARK, ENGINEER, assetIdByName, demoActor } from '../helpers/actors';
import { addReadings, removeReadings } from '../helpers/readings';

describe('assessment sign-off', () => {
	let sequelize: Sequelize;
	let assetId: number;
	let engineer: Awaited<ReturnType<typeof demoActor>>;
	// A second person approves: the organisation asks for one (its default).
	let checker: Awaited<ReturnType<typeof demoActor>>;
	const methods = methodSchema.parse({});
	const save = (title: string, supersedes: { id: number; reason: string } | null = null) =>
		saveDraft(engineer, {
			assetId,
			title,
			surveyId: null,
			split: 'none',
			methods,
			recommendations: null,
			supersedes
		});
	beforeAll(async () => {
		sequelize = db();
		assetId = await assetIdByName(sequelize, CAR_PARK);
		engineer = await demoActor(sequelize, ENGINEER);
		checker = await demoActor(sequelize, ADMIN);
	});
	afterAll(async () => {
		await closeDb();
	});

	it('keeps an approved snapshot byte-identical after a later import of readings', async () => {
		const draft = await save('Level 2 and roof, first sign-off');
		await approve(checker, draft.id);
		const signed = await Assessment.findByPk(draft.id);
		expect(signed!.state).toBe('approved');
		const deck = await Member.findOne({ where: { assetId, label: 'L2-BAY-01' } });
		const batchId = await addReadings(
			deck!.surveyId,
			deck!.id,
			Array.from({ length: 50 }, (_, i) => ({ xMm: 10 * i, yMm: 10, coverMm: 12 }))
		);
		const after = await Assessment.findByPk(draft.id);
		expect(after!.snapshot).toBe(signed!.snapshot);
		expect(after!.snapshotSha256).toBe(signed!.snapshotSha256);
		expect(sha256Hex(after!.snapshot)).toBe(after!.snapshotSha256);
		// The import did change the live figures: a new draft counts the extra readings.
		const fresh = await save('After the extra readings');
		const count = (text: string) => JSON.parse(text).readingCount as number;
		expect(count(fresh.snapshot)).toBe(count(signed!.snapshot) + 50);
		await removeReadings(batchId);
		await fresh.destroy();
	});

	it('refuses to rewrite or delete an approved snapshot, in code and in the database', async () => {
		const [approved] = await Assessment.findAll({ where: { assetId, state: 'approved' } });
		approved.snapshot = '{}';
		await expect(approved.save()).rejects.toThrow(/cannot be changed/);
		await expect(
			sequelize.query("UPDATE assessments SET snapshot = '{}' WHERE id = ?", {
				replacements: [approved.id],
				type: QueryTypes.UPDATE
			})
		).rejects.toThrow(/cannot be changed/);
		await expect(
			sequelize.query('DELETE FROM assessments WHERE id = ?', {
				replacements: [approved.id],
				type: QueryTypes.DELETE
			})
		).rejects.toThrow(/cannot be deleted/);
	});

	it('supersedes an approved assessment with a reason, and only once', async () => {
		const [old] = await Assessment.findAll({ where: { assetId, state: 'approved' } });
		const next = await save('Second sign-off', {
			id: old.id,
			reason: 'Roof survey readings reviewed and accepted.'
		});
		// The services throw domain errors; the route layer answers them (here 409).
		await expect(loadOr404(() => approve(checker, old.id))).rejects.toMatchObject({
			status: 409
		});
		await approve(checker, next.id);
		await old.reload();
		expect(old.state).toBe('superseded');
		await expect(
			loadOr404(() => save('Third', { id: old.id, reason: 'Trying to replace a superseded one.' }))
		).rejects.toMatchObject({ status: 409 });
		const audit = await sequelize.query<{ n: number }>(
			"SELECT COUNT(*) AS n FROM audit_events WHERE action = 'assessment.approved'",
			{ type: QueryTypes.SELECT, plain: true }
		);
		expect(audit!.n).toBeGreaterThanOrEqual(2);
	});

	it('asks a second engineer to approve where the organisation requires it, and lets the preparer alone where it does not', async () => {
		const organisationId = engineer.organisationId;
		const setRule = (on: boolean) =>
			sequelize.query('UPDATE organisations SET second_approver_required = ? WHERE id = ?', {
				replacements: [on, organisationId],
				type: QueryTypes.UPDATE
			});
		const draft = await save('Checked by a second engineer');
		await expect(loadOr404(() => approve(engineer, draft.id))).rejects.toMatchObject({
			status: 409,
			body: { message: expect.stringMatching(/second engineer/) }
		});
		expect((await Assessment.findByPk(draft.id))!.state).toBe('draft');
		await approve(checker, draft.id);
		const signed = await Assessment.findByPk(draft.id);
		expect(signed!.createdByUserId).toBe(engineer.userId);
		expect(signed!.approvedByUserId).toBe(checker.userId);
		await setRule(false);
		try {
			const alone = await save('Approved by its preparer, rule off', {
				id: draft.id,
				reason: 'The organisation lets the preparer approve alone.'
			});
			await approve(engineer, alone.id);
			expect((await Assessment.findByPk(alone.id))!.approvedByUserId).toBe(engineer.userId);
		} finally {
			await setRule(true);
		}
	});
});
