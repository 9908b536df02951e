import type { RequestEvent } from '@sveltejs/kit';

/**
 * Works out who is asking (session cookie or bearer token) and fills event.locals.
 * Sign-in arrives with the sign-in issue; until then every request is anonymous.
 */
export async function resolveAuth(event: RequestEvent): Promise<void> {
	void event;
}
