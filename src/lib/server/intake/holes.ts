import { VerificationHole } from '../db/models';
import { recordAudit } from '../audit';
import { InputError } from '../domainErrors';
import type { HoleInput } from '$lib/intake/schemas';
import type { Actor } from '../policy';
import { scopedMember } from '../scope';
import { assertSurveyEditable } from './frozen';

export async function listHoles(actor: Actor, memberId: number) {
	await scopedMember(actor, memberId, 'read');
	return VerificationHole.findAll({ where: { memberId }, order: [['label', 'ASC']] });
}

/** A drilled check hole: the meter's reading beside the cover measured in the hole. */
export async function createHole(actor: Actor, memberId: number, input: HoleInput) {
	const { member, survey } = await scopedMember(actor, memberId, 'write');
	assertSurveyEditable(survey);
	return VerificationHole.sequelize!.transaction(async (transaction) => {
		const clash = await VerificationHole.findOne({
			where: { memberId, label: input.label },
			transaction
		});
		if (clash)
			throw new InputError(`Hole "${input.label}" is already recorded on this member.`, {
				label: ['Already used.']
			});
		const hole = await VerificationHole.create({ ...input, memberId }, { transaction });
		await recordAudit(
			{
				action: 'hole.created',
				organisationId: actor.organisationId,
				userId: actor.userId,
				subjectType: 'member',
				subjectId: member.id,
				detail: {
					label: hole.label,
					meterReadingMm: hole.meterReadingMm,
					measuredCoverMm: hole.measuredCoverMm
				}
			},
			transaction
		);
		return hole;
	});
}
