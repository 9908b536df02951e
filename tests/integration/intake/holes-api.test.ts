/**
 * Verification holes corrected and deleted through /api/v1/holes/:id, over HTTP against the
 * built app and the real database: validated, asked of the policy, frozen with their survey,
 * another organisation's hole 404, every change an audit event.
 */
import { describe, expect, it } from 'vitest';
import { VerificationHole } from '../../../src/lib/server/db/models';
import {
	asDemoSurveyor,
	auditOf,
	editableRecords,
	foreignRecords,
	submitSurvey
} from '../../helpers/editing';
import { anonymousClient, signInAs } from '../../helpers/session';

const CORRECTED = {
	label: 'H1',
	xMm: 100,
	yMm: 200,
	meterReadingMm: 31,
	measuredCoverMm: 34.5,
	barDiameterMm: 12,
	method: 'drilled, depth gauge',
	notes: null
};

describe('/api/v1/holes/:id (the built app, the real database)', () => {
	const session = asDemoSurveyor();

	it('corrects a hole and logs each changed value, old and new', async () => {
		const { hole, member } = await editableRecords(session.actor);
		const response = await session.surveyor.putJson(`/api/v1/holes/${hole.id}`, CORRECTED);
		expect(response.status).toBe(200);
		expect((await response.json()).hole).toMatchObject({ id: hole.id, measuredCoverMm: 34.5 });
		await hole.reload();
		expect(hole.measuredCoverMm).toBe(34.5);
		const [event] = await auditOf('hole.updated', 'member', member.id);
		expect(event.detail).toEqual({
			holeId: hole.id,
			label: 'H1',
			changes: {
				measuredCoverMm: { from: 33, to: 34.5 },
				method: { from: 'drilled', to: 'drilled, depth gauge' }
			}
		});
		// The same values again change nothing, and so log nothing.
		expect((await session.surveyor.putJson(`/api/v1/holes/${hole.id}`, CORRECTED)).status).toBe(
			200
		);
		expect(await auditOf('hole.updated', 'member', member.id)).toHaveLength(1);
	});

	it('answers a bad value or a taken label 400 naming the field, and changes nothing', async () => {
		const { hole, member } = await editableRecords(session.actor);
		await VerificationHole.create({
			memberId: member.id,
			label: 'H2',
			xMm: null,
			yMm: null,
			meterReadingMm: 40,
			measuredCoverMm: 41,
			barDiameterMm: null,
			method: null
		});
		const negative = await session.surveyor.putJson(`/api/v1/holes/${hole.id}`, {
			...CORRECTED,
			measuredCoverMm: -4
		});
		expect(negative.status).toBe(400);
		expect(await negative.json()).toEqual({
			error: {
				code: 'invalid_input',
				message: 'Measured cover must be at least 0.',
				field: 'measuredCoverMm'
			}
		});
		const taken = await session.surveyor.putJson(`/api/v1/holes/${hole.id}`, {
			...CORRECTED,
			label: 'h2'
		});
		expect(taken.status).toBe(400);
		expect((await taken.json()).error).toMatchObject({
			message: 'Hole "h2" is already recorded on this member.',
			field: 'label'
		});
		await hole.reload();
		expect([hole.label, hole.measuredCoverMm]).toEqual(['H1', 33]);
		expect(await auditOf('hole.updated', 'member', member.id)).toEqual([]);
	});

	it('deletes a hole (204), logs what it held, and then answers 404', async () => {
		const { hole, member } = await editableRecords(session.actor);
		const deleted = await session.surveyor.delete(`/api/v1/holes/${hole.id}`);
		expect(deleted.status).toBe(204);
		expect(await VerificationHole.findByPk(hole.id)).toBeNull();
		const [event] = await auditOf('hole.deleted', 'member', member.id);
		expect(event.detail).toEqual({
			holeId: hole.id,
			label: 'H1',
			meterReadingMm: 31,
			measuredCoverMm: 33
		});
		expect((await session.surveyor.delete(`/api/v1/holes/${hole.id}`)).status).toBe(404);
		expect((await session.surveyor.get(`/api/v1/holes/${hole.id}`)).status).toBe(404);
	});

	it('refuses to change or delete a hole of a submitted survey (409), which keeps it', async () => {
		const { hole, survey } = await editableRecords(session.actor);
		await submitSurvey(session.surveyor, survey.id);
		const put = await session.surveyor.putJson(`/api/v1/holes/${hole.id}`, CORRECTED);
		expect(put.status).toBe(409);
		expect((await put.json()).error.message).toBe(
			'The survey is submitted: its readings are frozen. An engineer can return it for changes.'
		);
		expect((await session.surveyor.delete(`/api/v1/holes/${hole.id}`)).status).toBe(409);
		await hole.reload();
		expect(hole.measuredCoverMm).toBe(33);
	});

	it("answers another organisation's hole 404 to read, change or delete, and leaves it", async () => {
		const { hole } = await foreignRecords();
		const path = `/api/v1/holes/${hole.id}`;
		expect((await session.surveyor.get(path)).status).toBe(404);
		expect((await session.surveyor.putJson(path, CORRECTED)).status).toBe(404);
		expect((await session.surveyor.delete(path)).status).toBe(404);
		await hole.reload();
		expect(hole.measuredCoverMm).toBe(33);
	});

	it('refuses a role without hole:write (403) and anyone signed out (401)', async () => {
		const { hole } = await editableRecords(session.actor);
		const owner = await signInAs('owner');
		expect((await owner.putJson(`/api/v1/holes/${hole.id}`, CORRECTED)).status).toBe(403);
		expect((await owner.delete(`/api/v1/holes/${hole.id}`)).status).toBe(403);
		const signedOut = await anonymousClient().delete(`/api/v1/holes/${hole.id}`);
		expect(signedOut.status).toBe(401);
		expect(await VerificationHole.findByPk(hole.id)).not.toBeNull();
	});
});
