import { createHash, randomBytes } from 'node:crypto';

/**
 * A random secret for a link or a token (32 bytes, base64url), and its sha256, which is all
 * we store: a leaked table then opens no account.
 */
export function newSecret(): { secret: string; hash: string } {
	const secret = randomBytes(32).toString('base64url');
	return { secret, hash: hashSecret(secret) };
}

export function hashSecret(secret: string): string {
	return createHash('sha256').update(secret, 'utf8').digest('hex');
}
