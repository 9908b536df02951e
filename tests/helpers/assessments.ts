/**
 * Assessments for tests that need one on the seeded demo readings: the snapshot is the one the
 * app stores (the production `buildSnapshot`, with the survey selection the save service makes),
 * written as a draft row; approval is stamped at a fixed time so that the report's dates repeat.
 */
import type { Sequelize } from 'sequelize';
import { ENGINE_VERSION } from '../../src/lib/analysis';
import { buildSnapshot, serialiseSnapshot } from '../../src/lib/server/assessments/snapshot';
import { Assessment, Asset, Reading, Survey, User } from '../../src/lib/server/db/models';
import { methodSchema, surveySelection } from '../../src/lib/server/populations';

export const CAR_PARK = 'Brackenfield Multi-storey Car Park';
export const CAR_PARK_SURVEY = 'Level 2 deck and soffits, condition survey';

/** The covers of each member, one query (read here so tests check the engine against the rows). */
export async function coversByMember(memberIds: number[]): Promise<Map<number, number[]>> {
	const rows = await Reading.findAll({
		attributes: ['memberId', 'coverMm'],
		where: { memberId: memberIds },
		raw: true
	});
	const out = new Map<number, number[]>(memberIds.map((id) => [id, []]));
	for (const r of rows) out.get(r.memberId)!.push(Number(r.coverMm));
	return out;
}

/** The snapshot the app would store for one survey of an asset, with the default methods. */
async function surveySnapshot(assetName: string, surveyTitle: string) {
	const asset = (await Asset.findOne({ where: { name: assetName } }))!;
	const survey = (await Survey.findOne({ where: { assetId: asset.id, title: surveyTitle } }))!;
	const selection = await surveySelection(asset.id, [survey.id]);
	const snapshot = await buildSnapshot(
		asset,
		{ surveyId: survey.id, split: 'none' },
		methodSchema.parse({}),
		selection
	);
	return { asset, survey, snapshot };
}

/** Insert a draft assessment of the survey, created by the demo engineer. */
export async function insertDraft(
	sequelize: Sequelize,
	assetName = CAR_PARK,
	surveyTitle = CAR_PARK_SURVEY
): Promise<Assessment> {
	void sequelize;
	const { asset, survey, snapshot } = await surveySnapshot(assetName, surveyTitle);
	const engineer = await User.findOne({ where: { email: 'engineer@kestrel-lane.example' } });
	const { text, sha256 } = serialiseSnapshot(snapshot);
	return Assessment.create({
		assetId: asset.id,
		surveyId: survey.id,
		title: `${surveyTitle}: cover assessment`,
		snapshot: text,
		snapshotSha256: sha256,
		engineVersion: ENGINE_VERSION,
		recommendations:
			'Break out and test chloride profiles in bays L2-BAY-04 and L2-BAY-07 first; plan a protective coating for the deck within five years.',
		createdByUserId: engineer?.id ?? null
	});
}

/** Approve as the demo engineer at a fixed time (the report's creation date is asserted). */
export async function approveDirectly(assessment: Assessment): Promise<void> {
	const engineer = await User.findOne({ where: { email: 'engineer@kestrel-lane.example' } });
	await assessment.update({
		state: 'approved',
		approvedByUserId: engineer?.id ?? null,
		approvedAt: new Date('2026-01-16T10:00:00Z')
	});
}

/** An approved car-park assessment with the default durability parameters, entered over HTTP. */
export async function approvedCarParkAssessment(
	sequelize: Sequelize,
	engineer: { putJson(path: string, body: unknown): Promise<Response> }
): Promise<Assessment> {
	const draft = await insertDraft(sequelize);
	const response = await engineer.putJson(`/api/v1/assessments/${draft.id}/durability`, {
		parameters: {}
	});
	if (response.status !== 200) throw new Error(`durability refused: ${await response.text()}`);
	await approveDirectly(draft);
	return draft;
}

/** An owner in an organisation of its own that nothing is shared with. */
export async function strangerOwner(tag: string): Promise<{ email: string; password: string }> {
	const { hashPassword } = await import('../../src/lib/server/auth/password');
	const { Membership, Organisation } = await import('../../src/lib/server/db/models');
	const password = 'stranger-owner-pass-2026';
	const organisation = await Organisation.create({
		name: `Elsewhere Holdings ${tag}`,
		slug: `elsewhere-${tag}`
	});
	const user = await User.create({
		email: `owner-${tag}@elsewhere.example`,
		displayName: 'Stranger Owner',
		passwordHash: await hashPassword(password),
		activeOrganisationId: organisation.id
	});
	await Membership.create({ userId: user.id, organisationId: organisation.id, role: 'owner' });
	return { email: user.email, password };
}
