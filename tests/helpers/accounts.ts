import { randomBytes } from 'node:crypto';
import { anonymousClient, httpClient, sessionCookieFrom, type HttpClient } from './session';

/** A password the rules accept, unlike any demo one. */
export const FRESH_PASSWORD = 'granite-ladder-orbit-47';

/** A unique address on the reserved .example domain, so tests never collide across runs. */
export function uniqueEmail(label: string): string {
	return `${label}-${randomBytes(4).toString('hex')}@tests.example`;
}

/** Signs up a new organisation over HTTP (its creator becomes admin, signed in at once). */
export async function signUpNewOrganisation(
	label: string,
	url?: string
): Promise<{ email: string; client: HttpClient }> {
	const email = uniqueEmail(label);
	const response = await anonymousClient(url).postForm('/sign-up', {
		displayName: `Test ${label}`,
		email,
		organisationName: `Test organisation ${label} ${randomBytes(3).toString('hex')}`,
		password: FRESH_PASSWORD
	});
	const cookie = sessionCookieFrom(response);
	if (response.status !== 303 || !cookie) throw new Error(`sign-up failed: ${response.status}`);
	return { email, client: httpClient({}, cookie, url) };
}
