/** Deleting a verification hole from its edit page (over HTTP, the built app, the real database). */
import { describe, expect, it } from 'vitest';
import { VerificationHole } from '../../../src/lib/server/db/models';
import {
	asDemoSurveyor,
	auditOf,
	editableRecords,
	foreignRecords,
	submitSurvey
} from '../../helpers/editing';

describe('deleting a hole through its page', () => {
	const session = asDemoSurveyor();

	it('removes the hole, logs what it held and goes back to its member (303)', async () => {
		const { hole, member } = await editableRecords(session.actor);
		const page = await (await session.surveyor.get(`/holes/${hole.id}/edit`)).text();
		expect(page).toContain('Delete this hole');
		const response = await session.surveyor.postForm(`/holes/${hole.id}/edit?/delete`);
		expect(response.status).toBe(303);
		expect(response.headers.get('location')).toBe(`/members/${member.id}/entry?saved=hole-deleted`);
		expect(await VerificationHole.findByPk(hole.id)).toBeNull();
		const [event] = await auditOf('hole.deleted', 'member', member.id);
		expect(event.detail).toMatchObject({ holeId: hole.id, label: 'H1', measuredCoverMm: 33 });
		expect((await session.surveyor.get(`/holes/${hole.id}/edit`)).status).toBe(404);
	});

	it('refuses a hole of a submitted survey (409, with the reason) and offers no delete', async () => {
		const { hole, survey } = await editableRecords(session.actor);
		await submitSurvey(session.surveyor, survey.id);
		expect(await (await session.surveyor.get(`/holes/${hole.id}/edit`)).text()).not.toContain(
			'Delete this hole'
		);
		const response = await session.surveyor.postForm(`/holes/${hole.id}/edit?/delete`);
		expect(response.status).toBe(409);
		expect(await response.text()).toContain('The survey is submitted: its readings are frozen.');
		expect(await VerificationHole.findByPk(hole.id)).not.toBeNull();
	});

	it("answers another organisation's hole 404 and leaves it", async () => {
		const { hole } = await foreignRecords();
		expect((await session.surveyor.postForm(`/holes/${hole.id}/edit?/delete`)).status).toBe(404);
		expect(await VerificationHole.findByPk(hole.id)).not.toBeNull();
	});
});
