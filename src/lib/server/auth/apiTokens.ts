import { Op, type Transaction } from 'sequelize';
import { ApiToken } from '../db/models';
import { hashSecret, newSecret } from './secrets';

/** Tokens start with this, so a leaked one is recognisable in logs and secret scanners. */
export const TOKEN_PREFIX = 'frt_';
export const TOKEN_MAX_DAYS = 365;

export interface TokenSummary {
	id: number;
	name: string;
	prefix: string;
	expiresAt: Date | null;
	lastUsedAt: Date | null;
	revokedAt: Date | null;
	createdAt: Date;
}

/** Makes a token for the user in their active organisation; the secret is returned only here. */
export async function createApiToken(
	input: { userId: number; organisationId: number; name: string; expiresInDays: number },
	transaction?: Transaction
): Promise<{ token: TokenSummary; secret: string }> {
	const random = newSecret().secret;
	const secret = `${TOKEN_PREFIX}${random}`;
	const row = await ApiToken.create(
		{
			userId: input.userId,
			organisationId: input.organisationId,
			name: input.name,
			tokenHash: hashSecret(secret),
			tokenPrefix: secret.slice(0, 12),
			expiresAt: new Date(Date.now() + input.expiresInDays * 86_400_000)
		},
		{ transaction }
	);
	return { token: summarise(row), secret };
}

/** The live token for a presented secret, or null (unknown, revoked or expired). */
export async function verifyApiToken(secret: string): Promise<ApiToken | null> {
	if (!secret.startsWith(TOKEN_PREFIX) || secret.length > 100) return null;
	const row = await ApiToken.findOne({
		where: {
			tokenHash: hashSecret(secret),
			revokedAt: null,
			[Op.or]: [{ expiresAt: null }, { expiresAt: { [Op.gt]: new Date() } }]
		}
	});
	if (row) await ApiToken.update({ lastUsedAt: new Date() }, { where: { id: row.id } });
	return row;
}

export async function listApiTokens(userId: number): Promise<TokenSummary[]> {
	const rows = await ApiToken.findAll({ where: { userId }, order: [['id', 'DESC']] });
	return rows.map(summarise);
}

/** Revokes one of the user's own tokens; null when it is not theirs (the route answers 404). */
export async function revokeApiToken(
	userId: number,
	tokenId: number,
	transaction?: Transaction
): Promise<TokenSummary | null> {
	const row = await ApiToken.findOne({ where: { id: tokenId, userId }, transaction });
	if (!row) return null;
	if (!row.revokedAt) await row.update({ revokedAt: new Date() }, { transaction });
	return summarise(row);
}

export function summarise(row: ApiToken): TokenSummary {
	return {
		id: row.id,
		name: row.name,
		prefix: row.tokenPrefix,
		expiresAt: row.expiresAt,
		lastUsedAt: row.lastUsedAt ?? null,
		revokedAt: row.revokedAt ?? null,
		createdAt: row.createdAt
	};
}

/**
 * Revokes every live token of the user, in every organisation: after a password reset or change
 * whoever held the old password may also have made tokens, and a token outlives any session.
 */
export async function revokeAllApiTokens(
	userId: number,
	transaction?: Transaction
): Promise<number> {
	const [revoked] = await ApiToken.update(
		{ revokedAt: new Date() },
		{ where: { userId, revokedAt: null }, transaction }
	);
	return revoked;
}
