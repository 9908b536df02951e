import { env } from '$env/dynamic/private';
import { checkIdSecret } from './pseudonym';

/** The server secret behind the pseudonyms, checked on first use (a clear message if unset). */
export function researchIdSecret(): string {
	return checkIdSecret(env.RESEARCH_ID_SECRET);
}
