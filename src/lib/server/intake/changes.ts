import type { Attributes, Model, Transaction } from 'sequelize';
import { recordAudit } from '../audit';
import type { Actor } from '../policy';

/** Each changed field's value before and after an edit, as the audit log keeps it. */
type FieldChanges = Record<string, { from: unknown; to: unknown }>;

/** Long notes are cut in the audit detail; the record itself keeps them whole. */
const AUDIT_TEXT_MAX = 200;

function forAudit(value: unknown): unknown {
	return typeof value === 'string' && value.length > AUDIT_TEXT_MAX
		? `${value.slice(0, AUDIT_TEXT_MAX)}…`
		: value;
}

/**
 * Sets `input` on `record` and saves the fields that differ (Sequelize compares each with the
 * value read), returning what changed, old and new. An edit that changes nothing writes nothing.
 */
async function saveChanges<M extends Model>(
	record: M,
	input: Partial<Attributes<M>>,
	transaction: Transaction
): Promise<FieldChanges> {
	record.set(input);
	const fields = (record.changed() || []) as (keyof Attributes<M> & string)[];
	const changes: FieldChanges = {};
	for (const field of fields) {
		changes[field] = { from: forAudit(record.previous(field)), to: forAudit(record.get(field)) };
	}
	if (fields.length) await record.save({ transaction });
	return changes;
}

export interface ChangeSubject {
	type: 'asset' | 'survey' | 'member';
	id: number;
	/** What names the record in the log beside its id (a label, a title). */
	detail: Record<string, unknown>;
}

/** The audit event of an edit, with its changes; none when nothing changed. */
async function auditChanges(
	actor: Actor,
	action: string,
	subject: ChangeSubject,
	changes: FieldChanges,
	transaction: Transaction
): Promise<void> {
	if (Object.keys(changes).length === 0) return;
	await recordAudit(
		{
			action,
			organisationId: actor.organisationId,
			userId: actor.userId,
			subjectType: subject.type,
			subjectId: subject.id,
			detail: { ...subject.detail, changes }
		},
		transaction
	);
}

/** Saves an edit and logs it in the same transaction: both happen, or neither. */
export async function saveAudited<M extends Model>(
	actor: Actor,
	action: string,
	record: M,
	input: Partial<Attributes<M>>,
	subject: ChangeSubject,
	transaction: Transaction
): Promise<M> {
	const changes = await saveChanges(record, input, transaction);
	await auditChanges(actor, action, subject, changes, transaction);
	return record;
}
