import { db } from '../db';
import { recordAudit } from '../audit';
import type { Actor } from '../policy';
import { createApiToken, revokeApiToken } from './apiTokens';

/** Token creation and revocation with their audit events, each in one transaction. */
export function createTokenFor(
	actor: Actor,
	input: { name: string; expiresInDays: number },
	ipAddress: string
) {
	return db().transaction(async (transaction) => {
		const created = await createApiToken(
			{ userId: actor.userId, organisationId: actor.organisationId, ...input },
			transaction
		);
		await recordAudit(
			{
				action: 'token.created',
				userId: actor.userId,
				organisationId: actor.organisationId,
				subjectType: 'api_token',
				subjectId: created.token.id,
				detail: { name: input.name, prefix: created.token.prefix },
				ipAddress
			},
			transaction
		);
		return created;
	});
}

export function revokeTokenOf(actor: Actor, tokenId: number, ipAddress: string) {
	return db().transaction(async (transaction) => {
		const revoked = await revokeApiToken(actor.userId, tokenId, transaction);
		if (revoked) {
			await recordAudit(
				{
					action: 'token.revoked',
					userId: actor.userId,
					organisationId: actor.organisationId,
					subjectType: 'api_token',
					subjectId: tokenId,
					ipAddress
				},
				transaction
			);
		}
		return revoked;
	});
}
