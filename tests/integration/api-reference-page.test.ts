import { describe, expect, it } from 'vitest';
import { anonymousClient } from '../helpers/session';

/** The page's visible text: markup and the hydration script's data left out. */
function visibleText(html: string): string {
	return html
		.replace(/<script[\s\S]*?<\/script>/g, '')
		.replace(/<[^>]+>/g, ' ')
		.replace(/&lt;/g, '<')
		.replace(/&gt;/g, '>')
		.replace(/&amp;/g, '&');
}

describe('the API reference page', () => {
	it('prints code in a code face, never raw backticks', async () => {
		const html = await (await anonymousClient().get('/docs/api')).text();
		const text = visibleText(html);
		expect(text).toContain('Authorization: Bearer <token>');
		expect(text).not.toContain('`');
		expect(html).toMatch(/<code[^>]*>Authorization: Bearer &lt;token>/);
	});

	it('shows the fields of the body schemas it names', async () => {
		const html = await (await anonymousClient().get('/docs/api')).text();
		const named = [...html.matchAll(/Takes JSON \(([A-Za-z]+)\)/g)].map((m) => m[1]);
		expect(named.length, 'operations that take a named JSON body').toBeGreaterThan(3);
		for (const name of new Set(named)) {
			expect(html, `the fields of ${name}`).toContain(`data-testid="schema-${name}"`);
		}
		// SurveyInput, for one, is shown with its fields and which are required.
		const survey = html.match(/data-testid="schema-SurveyInput"[\s\S]*?<\/details>/)?.[0] ?? '';
		expect(survey).toContain('surveyDate');
		expect(survey).toContain('title');
	});
});
