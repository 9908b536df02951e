import type { Transaction } from 'sequelize';
import { readingCounts } from '../readings/coverSets';
import { Member } from '../db/models';
import { recordAudit } from '../audit';
import { InputError } from '../domainErrors';
import { memberSchema, type MemberInput } from '$lib/intake/schemas';
import type { Actor } from '../policy';
import { scopedMember, scopedSurvey } from '../access';
import { assertSurveyEditable, assertSurveyEditableLocked } from './frozen';
import { saveAudited } from './changes';
import { labelKey } from '../import/validateRow';

export interface MemberSummary {
	id: number;
	label: string;
	memberType: string;
	face: string;
	exposureClass: string;
	cMinMm: number;
	cNomMm: number;
	readingCount: number;
}

export async function listMembers(actor: Actor, surveyId: number): Promise<MemberSummary[]> {
	await scopedSurvey(actor, surveyId, 'read');
	const members = await Member.findAll({ where: { surveyId }, order: [['label', 'ASC']] });
	const byId = await readingCounts(members.map((m) => m.id));
	return members.map((m) => ({
		id: m.id,
		label: m.label,
		memberType: m.memberType,
		face: m.face,
		exposureClass: m.exposureClass,
		cMinMm: m.cMinMm,
		cNomMm: m.cNomMm,
		readingCount: byId.get(m.id) ?? 0
	}));
}

async function auditMembers(
	actor: Actor,
	action: string,
	surveyId: number,
	labels: string[],
	transaction: Transaction
) {
	await recordAudit(
		{
			action,
			organisationId: actor.organisationId,
			userId: actor.userId,
			subjectType: 'survey',
			subjectId: surveyId,
			detail: { labels: labels.slice(0, 200), count: labels.length }
		},
		transaction
	);
}

/**
 * Creates members all together or not at all. Labels must be unique in the survey, ignoring
 * case as the unique index does; each clash is named with its row.
 */
export async function createMembers(
	actor: Actor,
	surveyId: number,
	inputs: MemberInput[],
	/** Line number of the first input, to name rows as the user sees them (2 under a header). */
	firstRow = 1
): Promise<Member[]> {
	return Member.sequelize!.transaction(async (transaction) => {
		const { survey } = await scopedSurvey(actor, surveyId, 'write', transaction);
		assertSurveyEditable(survey);
		const existing = await Member.findAll({
			where: { surveyId },
			attributes: ['label'],
			transaction
		});
		const taken = new Map(existing.map((m) => [labelKey(m.label), 'an existing member']));
		const problems: string[] = [];
		inputs.forEach((input, i) => {
			const key = labelKey(input.label);
			const clash = taken.get(key);
			if (clash)
				problems.push(`Row ${i + firstRow}: label "${input.label}" is already used by ${clash}.`);
			else taken.set(key, `row ${i + firstRow}`);
		});
		if (problems.length) {
			throw new InputError(
				`Duplicate member labels; no member was created. ${problems.slice(0, 10).join(' ')}`,
				{
					label: problems
				}
			);
		}
		const created = await Member.bulkCreate(
			inputs.map((input) => ({ ...input, surveyId, assetId: survey.assetId })),
			{ transaction }
		);
		await auditMembers(
			actor,
			'member.created',
			surveyId,
			inputs.map((i) => i.label),
			transaction
		);
		return created;
	});
}

export async function updateMember(
	actor: Actor,
	memberId: number,
	input: MemberInput
): Promise<Member> {
	return Member.sequelize!.transaction(async (transaction) => {
		const { member, survey } = await scopedMember(actor, memberId, 'write', transaction);
		await assertSurveyEditableLocked(survey, transaction);
		// The unique index ignores case, as this lookup does: "m-01" clashes with "M-01".
		const clash = await Member.findOne({
			where: { surveyId: survey.id, label: input.label },
			transaction
		});
		if (clash && clash.id !== member.id) {
			throw new InputError(`Label "${input.label}" is already used in this survey.`, {
				label: ['Already used by another member of this survey.']
			});
		}
		const detail = { surveyId: survey.id, label: member.label };
		const subject = { type: 'member' as const, id: member.id, detail };
		return saveAudited(actor, 'member.updated', member, input, subject, transaction);
	});
}

export { memberSchema };
