/**
 * Carbonation tests of a member: recorded and removed while the survey is a draft or returned,
 * each change audited in its transaction; frozen with the survey like its readings.
 */
import type { CarbonationTestInput } from '$lib/intake/measurements';
import { CarbonationTest, Member } from '../db/models';
import type { Actor } from '../policy';
import { scopedCarbonationTest, scopedMember, scopedSurvey } from '../access';
import { assertSurveyEditableLocked } from './frozen';
import { assertLabelFree, auditMeasurement } from './measurementRecords';

const ORDER: [string, string][] = [
	['testedOn', 'ASC'],
	['label', 'ASC']
];

export async function listCarbonationTests(actor: Actor, memberId: number) {
	await scopedMember(actor, memberId, 'read');
	return CarbonationTest.findAll({ where: { memberId }, order: ORDER });
}

/** Every carbonation test of a survey's members, by member. */
export async function carbonationTestsOfSurvey(actor: Actor, surveyId: number) {
	await scopedSurvey(actor, surveyId, 'read');
	const members = await Member.findAll({ attributes: ['id'], where: { surveyId } });
	return CarbonationTest.findAll({
		where: { memberId: members.map((m) => m.id) },
		order: [['memberId', 'ASC'], ...ORDER]
	});
}

const depths = (t: CarbonationTest) => ({
	depthsMm: t.depthsMm,
	depthMinMm: t.depthMinMm,
	depthMeanMm: t.depthMeanMm,
	depthMaxMm: t.depthMaxMm
});

export async function createCarbonationTest(
	actor: Actor,
	memberId: number,
	input: CarbonationTestInput
) {
	return CarbonationTest.sequelize!.transaction(async (transaction) => {
		const { survey } = await scopedMember(actor, memberId, 'write', transaction);
		await assertSurveyEditableLocked(survey, transaction);
		await assertLabelFree(CarbonationTest, 'Carbonation test', memberId, input.label, transaction);
		const test = await CarbonationTest.create({ ...input, memberId }, { transaction });
		await auditMeasurement(actor, 'carbonation_test', 'created', test, depths(test), transaction);
		return test;
	});
}

/** Removes a test recorded in error; the audit event keeps what it said. */
export async function deleteCarbonationTest(actor: Actor, id: number) {
	return CarbonationTest.sequelize!.transaction(async (transaction) => {
		const { record, survey } = await scopedCarbonationTest(actor, id, 'write', transaction);
		await assertSurveyEditableLocked(survey, transaction);
		await record.destroy({ transaction });
		await auditMeasurement(
			actor,
			'carbonation_test',
			'deleted',
			record,
			depths(record),
			transaction
		);
		return { id: record.id, memberId: record.memberId };
	});
}
