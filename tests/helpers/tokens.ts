import { signInAs, tokenClient, type DemoRole, type HttpClient } from './session';

/** Signs in as a demo role over HTTP and makes a personal API token; a client that uses it. */
export async function tokenFor(
	role: DemoRole,
	url?: string
): Promise<{ secret: string; client: HttpClient }> {
	const session = await signInAs(role, url);
	const response = await session.postJson('/api/v1/tokens', {
		name: `test ${role}`,
		expiresInDays: 1
	});
	if (response.status !== 201)
		throw new Error(`token for ${role}: ${response.status} ${await response.text()}`);
	const { secret } = (await response.json()) as { secret: string };
	return { secret, client: tokenClient(secret, url) };
}
