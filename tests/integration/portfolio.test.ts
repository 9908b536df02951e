import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Sequelize } from 'sequelize';
import type { Assessment } from '../../src/lib/server/db/models';
import { testSequelize } from '../helpers/database';
import { approvedCarParkAssessment, strangerOwner } from '../helpers/assessments';
import { signIn, signInAs } from '../helpers/session';

describe('the owner’s portfolio', () => {
	let sequelize: Sequelize;
	let assessment: Assessment;

	beforeAll(async () => {
		sequelize = testSequelize();
		assessment = await approvedCarParkAssessment(sequelize, await signInAs('engineer'));
		// The portfolio shows the latest approval; a file that ran earlier (assessments.test.ts)
		// may have approved one today, later than the helper's fixed date. Make this one latest.
		await assessment.update({ approvedAt: new Date() });
	});
	afterAll(async () => {
		await sequelize.close();
	});

	it('shows the demo owner the shared assets and ranks the car-park deck first', async () => {
		const owner = await signInAs('owner');
		const response = await owner.get('/portfolio');
		expect(response.status).toBe(200);
		const html = await response.text();
		expect(html).toContain('Look at first');
		expect(html).toContain('Orchard Row Office Building');
		expect(html).toContain('Millrace Footbridge');
		const ranked = html.slice(html.indexOf('Look at first'));
		expect(ranked.indexOf('deck · XD3')).toBeGreaterThan(-1);
		expect(ranked.indexOf('deck · XD3')).toBeLessThan(ranked.indexOf('column · XD3'));
		expect(html).toContain('Decision support, not a decision.');
	});

	it('opens the asset page with its parts, chart table and recommendations', async () => {
		const owner = await signInAs('owner');
		const response = await owner.get(`/portfolio/${assessment.assetId}`);
		expect(response.status).toBe(200);
		const html = await response.text();
		expect(html).toContain('Risk over time');
		expect(html).toContain('The same figures as a table');
		expect(html).toContain('Break out and test chloride profiles');
		expect(html).not.toContain('Send by e-mail');
		// Every projection input with its basis: the decks and columns rest on their chloride
		// profiles (fitted, measured), the slab on defaults alone, so it alone is indicative.
		expect(html).toContain('What the projections rest on');
		expect(html).toContain('data-basis="fitted"');
		expect(html).toContain('data-basis="measured"');
		expect(html).toContain('data-basis="assumed"');
		expect(html).toContain('Default: From memory');
		expect(html).toContain('Measured: from 6 fitted chloride profiles');
		expect(html).toContain('Most telling input:');
		expect(html).toContain('Indicative: assumed, not measured. Measure carbonation depths');
		expect(html).not.toContain('Indicative: assumed, not measured. Take chloride samples');
	});

	it('shows an owner of another organisation nothing (404)', async () => {
		const stranger = await strangerOwner(`portfolio${Date.now()}`);
		const client = await signIn(stranger.email, stranger.password);
		expect((await client.get(`/portfolio/${assessment.assetId}`)).status).toBe(404);
		const list = await (await client.get('/portfolio')).text();
		expect(list).not.toContain('Brackenfield');
	});
});
