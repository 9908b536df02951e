import { hash, verify } from '@node-rs/argon2';

/** @node-rs/argon2's Algorithm.Argon2id; its const enum cannot be imported under verbatimModuleSyntax. */
const ARGON2ID = 2;

/**
 * argon2id with the parameters of RFC 9106's second recommended option (§4: 64 MiB memory,
 * 3 passes) and 1 lane, so a hash costs ~100 ms on a 2-core machine and a few sign-ins at once
 * do not exhaust it.
 */
export const ARGON2_OPTIONS = {
	algorithm: ARGON2ID,
	memoryCost: 65_536,
	timeCost: 3,
	parallelism: 1,
	outputLen: 32
} as const;

export function hashPassword(password: string): Promise<string> {
	return hash(password, ARGON2_OPTIONS);
}

export async function verifyPassword(passwordHash: string, password: string): Promise<boolean> {
	try {
		return await verify(passwordHash, password);
	} catch {
		return false;
	}
}
