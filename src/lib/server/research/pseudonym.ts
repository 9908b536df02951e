import { createHmac } from 'node:crypto';

/**
 * Pseudonymous identifiers for research output: a keyed hash (HMAC-SHA256) of the record's own
 * id under the server's RESEARCH_ID_SECRET. The same member keeps its identifier in every
 * export; without the secret nobody can go from the identifier back to the record (nor test a
 * guess, as they could with a plain hash of a small integer). 64 bits of the digest are kept:
 * collisions are negligible for the millions of members a national dataset could hold.
 */
export type PseudonymKind = 'asset' | 'member';

const PREFIX: Record<PseudonymKind, string> = { asset: 'A', member: 'M' };

/** At least 16 characters: a short secret could be guessed by trying. */
export const MIN_SECRET_LENGTH = 16;

export function checkIdSecret(secret: string | undefined): string {
	if (!secret || secret.length < MIN_SECRET_LENGTH) {
		throw new Error(
			`RESEARCH_ID_SECRET must be set to at least ${MIN_SECRET_LENGTH} characters (see .env.example)`
		);
	}
	return secret;
}

/** "A-3f9c…" / "M-81d0…": kind prefix and 16 hex digits of HMAC-SHA256(secret, "kind:id"). */
export function pseudonym(secret: string, kind: PseudonymKind, id: number): string {
	const digest = createHmac('sha256', secret).update(`${kind}:${id}`).digest('hex');
	return `${PREFIX[kind]}-${digest.slice(0, 16)}`;
}

/** A memoised pseudonym maker for one export or page (ids repeat on every reading of a member). */
export function pseudonymMaker(secret: string): (kind: PseudonymKind, id: number) => string {
	const cache = new Map<string, string>();
	return (kind, id) => {
		const key = `${kind}:${id}`;
		let value = cache.get(key);
		if (value === undefined) {
			value = pseudonym(secret, kind, id);
			cache.set(key, value);
		}
		return value;
	};
}

/** Year of construction coarsened to its decade (1998 → 1990); null stays null. */
export function constructionDecade(year: number | null): number | null {
	return year == null ? null : Math.floor(year / 10) * 10;
}
