/**
 * What the durability measurements' services share: the audit entry (logged against the member,
 * so that a deleted record's events still have a subject) and the label rule.
 */
import type { Model, ModelStatic, Transaction } from 'sequelize';
import { recordAudit } from '../audit';
import { InputError } from '../domainErrors';
import type { Actor } from '../policy';

export type MeasurementKind = 'carbonation_test' | 'chloride_profile';

export async function auditMeasurement(
	actor: Actor,
	kind: MeasurementKind,
	change: 'created' | 'deleted',
	record: { id: number; memberId: number; label: string },
	detail: Record<string, unknown>,
	transaction: Transaction
) {
	await recordAudit(
		{
			action: `${kind}.${change}`,
			organisationId: actor.organisationId,
			userId: actor.userId,
			subjectType: 'member',
			subjectId: record.memberId,
			detail: { id: record.id, label: record.label, ...detail }
		},
		transaction
	);
}

/** Labels are unique on their member (ignoring case, as the unique index does). */
export async function assertLabelFree<M extends Model>(
	model: ModelStatic<M>,
	what: string,
	memberId: number,
	label: string,
	transaction: Transaction
) {
	const clash = await model.findOne({ where: { memberId, label } as never, transaction });
	if (clash) {
		throw new InputError(`${what} "${label}" is already recorded on this member.`, {
			label: [`Already used by another ${what.toLowerCase()} on this member.`]
		});
	}
}
