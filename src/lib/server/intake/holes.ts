import type { Transaction } from 'sequelize';
import { VerificationHole } from '../db/models';
import { recordAudit } from '../audit';
import { InputError } from '../domainErrors';
import type { HoleInput } from '$lib/intake/schemas';
import type { Actor } from '../policy';
import { scopedHole, scopedMember } from '../access';
import { assertSurveyEditableLocked } from './frozen';
import { saveAudited } from './changes';

export async function listHoles(actor: Actor, memberId: number) {
	await scopedMember(actor, memberId, 'read');
	return VerificationHole.findAll({ where: { memberId }, order: [['label', 'ASC']] });
}

/** Hole labels are unique on their member (ignoring case, as the unique index does). */
async function assertLabelFree(
	memberId: number,
	label: string,
	holeId: number | null,
	transaction: Transaction
) {
	const clash = await VerificationHole.findOne({ where: { memberId, label }, transaction });
	if (clash && clash.id !== holeId) {
		throw new InputError(`Hole "${label}" is already recorded on this member.`, {
			label: ['Already used by another hole on this member.']
		});
	}
}

/** Holes are logged against their member, so that a deleted hole's events still have a subject. */
async function auditHole(
	actor: Actor,
	action: 'hole.created' | 'hole.deleted',
	hole: VerificationHole,
	detail: Record<string, unknown>,
	transaction: Transaction
) {
	await recordAudit(
		{
			action,
			organisationId: actor.organisationId,
			userId: actor.userId,
			subjectType: 'member',
			subjectId: hole.memberId,
			detail: { holeId: hole.id, label: hole.label, ...detail }
		},
		transaction
	);
}

const measured = (hole: VerificationHole) => ({
	meterReadingMm: hole.meterReadingMm,
	measuredCoverMm: hole.measuredCoverMm
});

/** A drilled check hole: the meter's reading beside the cover measured in the hole. */
export async function createHole(actor: Actor, memberId: number, input: HoleInput) {
	return VerificationHole.sequelize!.transaction((transaction) =>
		recordHole(actor, memberId, input, transaction)
	);
}

/** The same inside a transaction of the caller's (a site sync writes holes with its readings). */
export async function recordHole(
	actor: Actor,
	memberId: number,
	input: HoleInput,
	transaction: Transaction
) {
	const { survey } = await scopedMember(actor, memberId, 'write', transaction);
	await assertSurveyEditableLocked(survey, transaction);
	await assertLabelFree(memberId, input.label, null, transaction);
	const hole = await VerificationHole.create({ ...input, memberId }, { transaction });
	await auditHole(actor, 'hole.created', hole, measured(hole), transaction);
	return hole;
}

export async function updateHole(actor: Actor, holeId: number, input: HoleInput) {
	return VerificationHole.sequelize!.transaction(async (transaction) => {
		const { hole, survey } = await scopedHole(actor, holeId, 'write', transaction);
		await assertSurveyEditableLocked(survey, transaction);
		await assertLabelFree(hole.memberId, input.label, hole.id, transaction);
		const detail = { holeId: hole.id, label: hole.label };
		const subject = { type: 'member' as const, id: hole.memberId, detail };
		return saveAudited(actor, 'hole.updated', hole, input, subject, transaction);
	});
}

/** Removes a hole recorded in error; the audit event keeps what it said. */
export async function deleteHole(actor: Actor, holeId: number) {
	return VerificationHole.sequelize!.transaction(async (transaction) => {
		const { hole, survey } = await scopedHole(actor, holeId, 'write', transaction);
		await assertSurveyEditableLocked(survey, transaction);
		await hole.destroy({ transaction });
		await auditHole(actor, 'hole.deleted', hole, measured(hole), transaction);
		return { holeId: hole.id, memberId: hole.memberId };
	});
}
