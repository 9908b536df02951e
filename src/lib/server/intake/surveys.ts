import type { Transaction } from 'sequelize';
import { Member, Survey } from '../db/models';
import type { SurveyState } from '../db/models/Survey';
import { recordAudit } from '../audit';
import { StateError } from '../domainErrors';
import type { SurveyInput } from '$lib/intake/schemas';
import type { Actor } from '../policy';
import { scopedAsset, scopedSurvey } from '../access';
import { assertSurveyEditableLocked } from './frozen';
import { saveAudited } from './changes';
import { readingCounts } from '../readings/coverSets';
import { EMPTY_SURVEY_WORDS } from '$lib/intake/frozen';

export async function listSurveys(actor: Actor, assetId: number) {
	await scopedAsset(actor, assetId, 'read');
	return Survey.findAll({
		where: { assetId },
		order: [
			['surveyDate', 'DESC'],
			['id', 'DESC']
		]
	});
}

async function audit(
	actor: Actor,
	action: string,
	survey: Survey,
	detail: object,
	transaction: Transaction
) {
	await recordAudit(
		{
			action,
			organisationId: actor.organisationId,
			userId: actor.userId,
			subjectType: 'survey',
			subjectId: survey.id,
			detail: { ...detail }
		},
		transaction
	);
}

export async function createSurvey(actor: Actor, assetId: number, input: SurveyInput) {
	return Survey.sequelize!.transaction(async (transaction) => {
		await scopedAsset(actor, assetId, 'write', transaction);
		const survey = await Survey.create(
			{ ...input, assetId, surveyorUserId: actor.userId },
			{ transaction }
		);
		await audit(actor, 'survey.created', survey, { title: survey.title }, transaction);
		return survey;
	});
}

export async function updateSurvey(actor: Actor, surveyId: number, input: SurveyInput) {
	return Survey.sequelize!.transaction(async (transaction) => {
		const { survey } = await scopedSurvey(actor, surveyId, 'write', transaction);
		await assertSurveyEditableLocked(survey, transaction);
		const subject = { type: 'survey' as const, id: survey.id, detail: { title: survey.title } };
		return saveAudited(actor, 'survey.updated', survey, input, subject, transaction);
	});
}

/** draft → submitted (surveyor) → approved, or returned with a comment (engineer) → submitted. */
const TRANSITIONS: Record<
	'submit' | 'approve' | 'return',
	{ from: SurveyState[]; to: SurveyState }
> = {
	submit: { from: ['draft', 'returned'], to: 'submitted' },
	approve: { from: ['submitted'], to: 'approved' },
	return: { from: ['submitted'], to: 'returned' }
};

export async function transitionSurvey(
	actor: Actor,
	surveyId: number,
	step: 'submit' | 'approve' | 'return',
	comment: string | null = null
): Promise<Survey> {
	const { from, to } = TRANSITIONS[step];
	return Survey.sequelize!.transaction(async (transaction) => {
		const { survey } = await scopedSurvey(actor, surveyId, 'write', transaction);
		// Row lock: two reviewers at once cannot both act on the same submitted survey.
		await survey.reload({ transaction, lock: transaction.LOCK.UPDATE });
		if (!from.includes(survey.status)) {
			throw new StateError(
				`A ${survey.status} survey cannot be ${to}; it must be ${from.join(' or ')}.`
			);
		}
		if (step === 'return' && !comment)
			throw new StateError('Say what must change when returning a survey.');
		if (step === 'submit' && !(await hasReadings(survey.id, transaction))) {
			throw new StateError(EMPTY_SURVEY_WORDS);
		}
		const now = new Date();
		const previous = survey.status;
		await survey.update(
			step === 'submit'
				? { status: to, submittedAt: now }
				: { status: to, statusComment: comment, reviewedAt: now, reviewedByUserId: actor.userId },
			{ transaction }
		);
		await audit(actor, `survey.${to}`, survey, { from: previous, to, comment }, transaction);
		return survey;
	});
}

/** Whether any member of the survey has a reading: an empty survey has nothing to review. */
async function hasReadings(surveyId: number, transaction: Transaction): Promise<boolean> {
	const members = await Member.findAll({ attributes: ['id'], where: { surveyId }, transaction });
	if (members.length === 0) return false;
	const counts = await readingCounts(members.map((m) => m.id));
	return counts.size > 0;
}
