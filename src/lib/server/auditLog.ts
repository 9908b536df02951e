import { AuditEvent, User } from './db';
import type { Actor } from './policy';

/** Events on one page of the organisation's audit log. */
export const AUDIT_PAGE_SIZE = 50;

export interface AuditRow {
	id: number;
	at: Date;
	/** "Survey submitted" from "survey.submitted". */
	what: string;
	action: string;
	who: string;
	record: string;
	/** The event's detail as "name: value" lines, not raw JSON. */
	detail: string[];
}

export interface AuditPage {
	events: AuditRow[];
	page: number;
	pages: number;
	total: number;
}

/** One page (1-based, newest first) of the actor's organisation's audit events. */
export async function auditLogPage(actor: Actor, page: number): Promise<AuditPage> {
	const where = { organisationId: actor.organisationId };
	const total = await AuditEvent.count({ where });
	const pages = Math.max(1, Math.ceil(total / AUDIT_PAGE_SIZE));
	const current = Math.min(Math.max(1, page), pages);
	const events = await AuditEvent.findAll({
		where,
		order: [['id', 'DESC']],
		limit: AUDIT_PAGE_SIZE,
		offset: (current - 1) * AUDIT_PAGE_SIZE
	});
	const userIds = [...new Set(events.map((e) => e.userId).filter((id): id is number => !!id))];
	const users = await User.findAll({ where: { id: userIds }, attributes: ['id', 'displayName'] });
	const names = new Map(users.map((u) => [u.id, u.displayName]));
	return {
		page: current,
		pages,
		total,
		events: events.map((e) => ({
			id: e.id,
			at: e.createdAt,
			action: e.action,
			what: actionWords(e.action),
			who: e.userId ? (names.get(e.userId) ?? `user ${e.userId}`) : 'the system',
			record: e.subjectType ? `${e.subjectType} ${e.subjectId ?? ''}`.trim() : '',
			detail: detailLines(e.detail)
		}))
	};
}

/** "survey.submitted" → "Survey submitted"; "member.role_changed" → "Member role changed". */
export function actionWords(action: string): string {
	const words = action.replace(/[._-]+/g, ' ').replace(/([a-z])([A-Z])/g, '$1 $2');
	return words.charAt(0).toUpperCase() + words.slice(1).toLowerCase();
}

/** A value in a line of detail: text as it is, lists and records in short plain words. */
function valueWords(value: unknown): string {
	if (value === null || value === undefined || value === '') return '—';
	if (Array.isArray(value)) return value.map(valueWords).join(', ');
	if (typeof value === 'object') {
		return Object.entries(value as Record<string, unknown>)
			.map(([k, v]) => `${k} ${valueWords(v)}`)
			.join('; ');
	}
	return String(value);
}

/** `{ from, to }` (or `{ before, after }`) as "from → to", else null. */
function changeWords(value: unknown): string | null {
	if (!value || typeof value !== 'object') return null;
	const v = value as Record<string, unknown>;
	if ('from' in v && 'to' in v) return `${valueWords(v.from)} → ${valueWords(v.to)}`;
	if ('before' in v && 'after' in v) return `${valueWords(v.before)} → ${valueWords(v.after)}`;
	return null;
}

/**
 * The detail of an event, one "name: value" line per field: a state change as "from → to", an
 * edit's changed fields one per line as "field: before → after".
 */
export function detailLines(detail: unknown): string[] {
	if (detail === null || detail === undefined) return [];
	if (typeof detail !== 'object' || Array.isArray(detail)) return [valueWords(detail)];
	const record = detail as Record<string, unknown>;
	const lines: string[] = [];
	const own = changeWords(record);
	if (own) lines.push(own);
	for (const [key, value] of Object.entries(record)) {
		if (own && ['from', 'to', 'before', 'after'].includes(key)) continue;
		if (value === null || value === undefined || value === '') continue;
		const change = changeWords(value);
		if (change) lines.push(`${key}: ${change}`);
		else if (key === 'changes' && typeof value === 'object' && !Array.isArray(value)) {
			for (const [field, c] of Object.entries(value as Record<string, unknown>)) {
				lines.push(`${field}: ${changeWords(c) ?? valueWords(c)}`);
			}
		} else lines.push(`${key}: ${valueWords(value)}`);
	}
	return lines;
}

/** What one user did lately in the actor's organisation, newest first. */
export async function recentEventsOf(actor: Actor, userId: number, limit = 50) {
	const events = await AuditEvent.findAll({
		where: { organisationId: actor.organisationId, userId },
		order: [['id', 'DESC']],
		limit
	});
	return events.map((e) => ({ id: e.id, at: e.createdAt, action: e.action }));
}
