import { describe, expect, it } from 'vitest';
import { signInAs } from '../helpers/session';

/** The organisation's audit log as an admin reads it: pages of 50, in words, not raw JSON. */
describe('the audit log page', () => {
	it('shows at most 50 events a page, with the way to older ones, and no raw JSON', async () => {
		const admin = await signInAs('admin');
		// Enough events for a second page: each sign-in is one.
		for (let i = 0; i < 3; i++) await signInAs('admin');
		const first = await (await admin.get('/organisation/audit')).text();
		const total = Number(first.match(/([\d,]+) events? recorded/)?.[1].replace(/,/g, ''));
		expect(total).toBeGreaterThan(0);
		const shown = first.match(/<li class="grid/g) ?? [];
		expect(shown.length).toBe(Math.min(50, total));
		// Detail is lines of "name: value", never an object printed as JSON.
		expect(first).not.toMatch(/\{&quot;|\{"[a-zA-Z]+":/);
		expect(first).toContain('Auth sign in');
		if (total > 50) {
			expect(first).toContain('href="?page=2"');
			const second = await admin.get('/organisation/audit?page=2');
			expect(second.status).toBe(200);
			expect(await second.text()).toContain('Newer events');
		}
		// A page past the end shows the last page rather than failing.
		expect((await admin.get('/organisation/audit?page=999999')).status).toBe(200);
	});
});
