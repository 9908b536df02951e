/** An organisation's own rules: for now, whether a second engineer must approve assessments. */
import { db, Organisation } from '$lib/server/db';
import { recordAudit } from '$lib/server/audit';
import type { Actor } from '$lib/server/policy';

export async function secondApproverSetting(organisationId: number): Promise<boolean> {
	const organisation = await Organisation.findByPk(organisationId, {
		attributes: ['secondApproverRequired']
	});
	return organisation?.secondApproverRequired ?? true;
}

/** Turn the rule on or off for the actor's organisation, audited with what it was. */
export async function setSecondApprover(actor: Actor, required: boolean): Promise<void> {
	await db().transaction(async (transaction) => {
		const organisation = await Organisation.findByPk(actor.organisationId, {
			transaction,
			lock: transaction.LOCK.UPDATE
		});
		if (!organisation || organisation.secondApproverRequired === required) return;
		const was = organisation.secondApproverRequired;
		await organisation.update({ secondApproverRequired: required }, { transaction });
		await recordAudit(
			{
				action: 'organisation.approval_rule_changed',
				organisationId: actor.organisationId,
				userId: actor.userId,
				subjectType: 'organisation',
				subjectId: actor.organisationId,
				detail: { secondApproverRequired: { from: was, to: required } }
			},
			transaction
		);
	});
}
