/**
 * Shared report links: a random token mailed to a recipient, only its sha256 kept (report_links).
 * A link expires (default 14 days), can be revoked, opens without an account and shows only its
 * own report; every open is an audit event.
 */
import { createHash, randomBytes } from 'node:crypto';
import { z } from 'zod';
import { db, Assessment, ReportLink, User } from '$lib/server/db';
import { recordAudit } from '$lib/server/audit';
import { appLink, queueMail } from '$lib/server/mail';
import type { Actor } from '$lib/server/policy';
import { visibleAssessment } from '$lib/server/access';
import { GoneError, NotFoundError, StateError } from '$lib/server/domainErrors';

export const DEFAULT_LINK_DAYS = 14;

export const shareSchema = z.object({
	email: z.email('Enter the recipient’s e-mail address.').max(254, 'That address is too long.'),
	days: z.coerce
		.number('Give the number of days the link stays valid.')
		.int('Whole days only.')
		.min(1, 'At least 1 day.')
		.max(90, 'At most 90 days.')
		.default(DEFAULT_LINK_DAYS),
	view: z.enum(['report', 'owner'], 'Send the report or the owner view.').default('report')
});
export type ShareInput = z.infer<typeof shareSchema>;

export const tokenHash = (token: string) =>
	createHash('sha256').update(token, 'utf8').digest('hex');

/** An approved assessment of an asset the actor's organisation owns; NotFoundError otherwise. */
async function ownApproved(actor: Actor, assessmentId: number): Promise<Assessment> {
	const { assessment } = await visibleAssessment(actor, assessmentId, 'write');
	if (assessment.state !== 'approved') {
		throw new StateError('Only an approved assessment can be shared.');
	}
	return assessment;
}

/** Create a link and mail it. Returns the link's id (the token leaves only in the mail). */
export async function shareReport(
	actor: Actor,
	assessmentId: number,
	input: ShareInput
): Promise<number> {
	const assessment = await ownApproved(actor, assessmentId);
	const token = randomBytes(32).toString('base64url');
	const expiresAt = new Date(Date.now() + input.days * 86_400_000);
	const link = await db().transaction(async (transaction) => {
		const created = await ReportLink.create(
			{
				assessmentId,
				tokenHash: tokenHash(token),
				recipientEmail: input.email,
				createdByUserId: actor.userId,
				expiresAt
			},
			{ transaction }
		);
		await recordAudit(
			{
				action: 'report.link_created',
				organisationId: actor.organisationId,
				userId: actor.userId,
				subjectType: 'report_link',
				subjectId: created.id,
				detail: { assessmentId, recipient: input.email, expiresAt: expiresAt.toISOString() }
			},
			transaction
		);
		return created;
	});
	const url = appLink(`/r/${token}${input.view === 'owner' ? '' : '#report'}`);
	await queueMail({
		to: input.email,
		subject: `Cover assessment report: ${assessment.title}`,
		text: `A cover assessment report has been shared with you.\n\nOpen it here (no account needed): ${url}\n\nThe link works until ${expiresAt.toISOString().slice(0, 10)} and may be withdrawn earlier.\n\nThe report supports decisions; the governing design code and a licensed engineer decide.`,
		organisationId: actor.organisationId
	});
	return link.id;
}

export async function linksOf(actor: Actor, assessmentId: number) {
	await ownApproved(actor, assessmentId);
	return ReportLink.findAll({ where: { assessmentId }, order: [['id', 'DESC']] });
}

export async function revokeLink(
	actor: Actor,
	assessmentId: number,
	linkId: number
): Promise<void> {
	await ownApproved(actor, assessmentId);
	await db().transaction(async (transaction) => {
		const link = await ReportLink.findOne({
			where: { id: linkId, assessmentId },
			transaction,
			lock: transaction.LOCK.UPDATE
		});
		if (!link) throw new NotFoundError('The link');
		if (link.revokedAt) return;
		await link.update({ revokedAt: new Date() }, { transaction });
		await recordAudit(
			{
				action: 'report.link_revoked',
				organisationId: actor.organisationId,
				userId: actor.userId,
				subjectType: 'report_link',
				subjectId: link.id,
				detail: { assessmentId }
			},
			transaction
		);
	});
}

/**
 * Open a link: the assessment it shows, with the open recorded. A link that is unknown, revoked
 * or expired answers 404 or 410 with no hint of which report it was.
 */
export interface OpenedLink {
	assessment: Assessment;
	/** Who sent the link, so the page can say who shared it. */
	sharedBy: string | null;
	expiresAt: Date;
}

const invalidLink = () => new NotFoundError('The link', 'This link is not valid.');

export async function openLink(token: string, ipAddress: string | null): Promise<OpenedLink> {
	if (!/^[A-Za-z0-9_-]{20,100}$/.test(token)) throw invalidLink();
	return db().transaction(async (transaction) => {
		const link = await ReportLink.findOne({
			where: { tokenHash: tokenHash(token) },
			transaction,
			lock: transaction.LOCK.UPDATE
		});
		if (!link) throw invalidLink();
		if (link.revokedAt) {
			throw new GoneError('This link has been withdrawn by the engineer who sent it.');
		}
		if (link.expiresAt.getTime() <= Date.now())
			throw new GoneError('This link has expired. Ask the engineer for a new one.');
		const assessment = await Assessment.findByPk(link.assessmentId, { transaction });
		if (!assessment || assessment.state === 'draft') throw invalidLink();
		await link.update({ lastOpenedAt: new Date() }, { transaction });
		await recordAudit(
			{
				action: 'report.link_opened',
				organisationId: null,
				userId: null,
				subjectType: 'report_link',
				subjectId: link.id,
				detail: { assessmentId: link.assessmentId },
				ipAddress
			},
			transaction
		);
		const sender = link.createdByUserId
			? await User.findByPk(link.createdByUserId, { attributes: ['displayName'], transaction })
			: null;
		return { assessment, sharedBy: sender?.displayName ?? null, expiresAt: link.expiresAt };
	});
}
