import type { Transaction } from 'sequelize';
import { AuditEvent } from './db/models';

export interface AuditInput {
	action: string;
	organisationId?: number | null;
	userId?: number | null;
	subjectType?: string | null;
	subjectId?: string | number | null;
	detail?: Record<string, unknown> | null;
	ipAddress?: string | null;
}

/**
 * Appends one audit event. Pass the caller's transaction when the event belongs to a change,
 * so that the change and its record are written together or not at all.
 */
export async function recordAudit(input: AuditInput, transaction?: Transaction): Promise<void> {
	await AuditEvent.create(
		{
			action: input.action,
			organisationId: input.organisationId ?? null,
			userId: input.userId ?? null,
			subjectType: input.subjectType ?? null,
			subjectId: input.subjectId == null ? null : String(input.subjectId),
			detail: input.detail ?? null,
			ipAddress: input.ipAddress ?? null
		},
		{ transaction }
	);
}
