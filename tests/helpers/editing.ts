import type { Sequelize } from 'sequelize';
import { afterAll, beforeAll } from 'vitest';
import { AuditEvent, Member, VerificationHole } from '../../src/lib/server/db/models';
import { addReadings } from './readings';
import type { Actor } from '../../src/lib/server/policy';
import { actorFor, freshSurvey, otherOrganisation, testSequelize } from './intake';
import { DEMO_USERS, signInAs, type HttpClient } from './session';

/**
 * For a describe block: the demo surveyor signed in over HTTP and as an actor for fixtures, and
 * the models on the test database; filled in before the first test, closed after the last.
 */
export function asDemoSurveyor() {
	const session = {} as { sequelize: Sequelize; actor: Actor; surveyor: HttpClient };
	beforeAll(async () => {
		session.sequelize = testSequelize();
		session.actor = await actorFor(DEMO_USERS.surveyor);
		session.surveyor = await signInAs('surveyor');
	});
	afterAll(() => session.sequelize.close());
	return session;
}

/**
 * A fresh draft survey of `actor`'s organisation on its own asset, with two members and one
 * verification hole on the first: one record of each kind that intake's edit pages change.
 */
export async function editableRecords(actor: Actor) {
	const { asset, survey, members } = await freshSurvey(actor, ['E-01', 'E-02']);
	const hole = await VerificationHole.create({
		memberId: members[0].id,
		label: 'H1',
		xMm: 100,
		yMm: 200,
		meterReadingMm: 31,
		measuredCoverMm: 33,
		barDiameterMm: 12,
		method: 'drilled'
	});
	return { asset, survey, member: members[0], otherMember: members[1], hole };
}
export type EditableRecords = Awaited<ReturnType<typeof editableRecords>>;

/** The same records in an organisation that is not the demo's. */
export async function foreignRecords() {
	const other = await otherOrganisation();
	return editableRecords(other.actor);
}

/**
 * Hands a survey to review through the API, as its surveyor would: its records freeze. A survey
 * without readings cannot be submitted, so its first member is given one reading first.
 */
export async function submitSurvey(client: HttpClient, surveyId: number): Promise<void> {
	const first = await Member.findOne({ where: { surveyId }, order: [['id', 'ASC']] });
	if (!first) throw new Error(`survey ${surveyId} has no member to give a reading`);
	await addReadings(surveyId, first.id, [{ xMm: 0, yMm: 0, coverMm: 30 }]);
	const response = await client.postJson(`/api/v1/surveys/${surveyId}/submit`, {});
	if (response.status !== 200) throw new Error(`submit failed: ${response.status}`);
}

/** The audit events of one subject, oldest first. */
export function auditOf(action: string, subjectType: string, subjectId: number) {
	return AuditEvent.findAll({
		where: { action, subjectType, subjectId: String(subjectId) },
		order: [['id', 'ASC']]
	});
}
