import { describe, expect, it } from 'vitest';
import { signInAs } from '../helpers/session';

/** Pages say what their words mean and give each role somewhere to start. */
describe('words on the pages', () => {
	it("explains 'depassivated' to an owner beside the risk chart", async () => {
		const owner = await signInAs('owner');
		const portfolio = await (await owner.get('/portfolio')).text();
		const assetId = portfolio.match(/href="\/portfolio\/(\d+)"/)?.[1];
		expect(assetId).toBeTruthy();
		const page = await (await owner.get(`/portfolio/${assetId}`)).text();
		expect(page).toMatch(/data-testid="depassivated-words">[^<]*no longer keeps it from corroding/);
	});

	it('gives a researcher a dashboard with places to start', async () => {
		const researcher = await signInAs('researcher');
		const page = await (await researcher.get('/dashboard')).text();
		const start = page.match(/data-testid="research-start"[\s\S]*?<\/ul>/)?.[0] ?? '';
		for (const href of ['/research', '/account/tokens', '/docs/api']) {
			expect(start).toContain(`href="${href}"`);
		}
		expect(page).toContain('Decision support, not a decision.');
	});

	it('counts with the right plural on the dashboard: "1 of 1 population does not comply"', async () => {
		const engineer = await signInAs('engineer');
		const page = await (await engineer.get('/dashboard')).text();
		expect(page).not.toMatch(/\b1 populations\b|\b1 members\b/);
		// The mark and its words are apart, not "✕1 of…" or "–No approved…".
		expect(page).not.toMatch(/[✕✓?–]\s*<\/span>[A-Z0-9]/);
	});
});
