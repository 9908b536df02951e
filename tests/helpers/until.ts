/** Polls `check` until it gives a truthy value, which it returns; throws after `timeoutMs`. */
export async function until<T>(
	what: string,
	check: () => Promise<T | undefined | null | false>,
	timeoutMs = 20_000,
	intervalMs = 100
): Promise<T> {
	const deadline = Date.now() + timeoutMs;
	for (;;) {
		const value = await check();
		if (value) return value;
		if (Date.now() > deadline) throw new Error(`${what}: not within ${timeoutMs} ms`);
		await new Promise((r) => setTimeout(r, intervalMs));
	}
}
