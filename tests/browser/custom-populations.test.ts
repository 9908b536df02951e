import type { Browser, Page } from 'playwright-core';
import { mkdirSync } from 'node:fs';
import { QueryTypes, type Sequelize } from 'sequelize';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { launchChromium, SCREENSHOT_DIR } from '../helpers/browser';
import { testSequelize } from '../helpers/database';
import { CAR_PARK, assetIdByName } from '../helpers/actors';
import { appUrl } from '../helpers/env';
import { browserSignIn, screenshot } from '../helpers/pages';

/**
 * The engineer renames and deletes a population made by hand on the overview, and chooses which
 * ones an assessment carries on the save form.
 */
describe('populations made by the engineers, on the overview and the save form', () => {
	let browser: Browser;
	let page: Page;
	let sequelize: Sequelize;
	let assetId: number;
	let memberId: number;
	const saved: number[] = [];

	/** A population of one member, made through the API with the page's session. */
	const make = async (name: string) => {
		const response = await page.request.post(`/api/v1/assets/${assetId}/populations/custom`, {
			data: { name, members: [memberId] },
			headers: { origin: new URL(appUrl()).origin }
		});
		expect(response.status()).toBe(201);
		return ((await response.json()) as { population: { id: number } }).population.id;
	};

	beforeAll(async () => {
		mkdirSync(SCREENSHOT_DIR, { recursive: true });
		sequelize = testSequelize();
		assetId = await assetIdByName(sequelize, CAR_PARK);
		const row = await sequelize.query<{ id: number }>(
			`SELECT m.id FROM members m JOIN surveys s ON s.id = m.survey_id
			  WHERE m.asset_id = ? AND s.status = 'approved' ORDER BY m.id LIMIT 1`,
			{ replacements: [assetId], type: QueryTypes.SELECT, plain: true }
		);
		memberId = row!.id;
		browser = await launchChromium();
		page = await browserSignIn(browser, 'engineer');
	});
	afterAll(async () => {
		for (const id of saved) {
			await sequelize.query('DELETE FROM assessment_risks WHERE assessment_id = ?', {
				replacements: [id]
			});
			await sequelize.query('DELETE FROM assessments WHERE id = ?', { replacements: [id] });
		}
		await browser?.close();
		await sequelize.close();
	});

	it('says “1 member chosen”, renames the population and deletes it', async () => {
		const name = `One member ${Date.now()}`;
		const id = await make(name);
		await page.goto(`/assets/${assetId}/populations`);
		const heading = page.locator(`h3[data-custom="${id}"]`);
		await heading.waitFor();
		await expect(heading.textContent()).resolves.toContain('— 1 member chosen');

		await heading.getByTestId('rename-custom').click();
		const renamed = `${name} renamed`;
		await heading.getByLabel(`New name of ${name}`).fill(renamed);
		await heading.getByRole('button', { name: 'Save the name' }).click();
		await page.locator(`h3[data-custom="${id}"]`, { hasText: renamed }).waitFor();
		await heading.scrollIntoViewIfNeeded();
		await screenshot(page, 'custom-population-renamed');

		page.once('dialog', (dialog) => dialog.accept());
		await heading.getByTestId('delete-custom').click();
		await page.locator(`h3[data-custom="${id}"]`).waitFor({ state: 'detached' });
		const rows = await sequelize.query('SELECT id FROM custom_populations WHERE id = ?', {
			replacements: [id],
			type: QueryTypes.SELECT
		});
		expect(rows).toEqual([]);
	});

	it('saves an assessment carrying only the ticked custom populations', async () => {
		const stamp = Date.now();
		const kept = await make(`Carried ${stamp}`);
		const dropped = await make(`Tried only ${stamp}`);
		await page.goto(`/assets/${assetId}/assessments`);
		const choice = page.getByTestId('save-custom');
		await choice.waitFor();
		// Every one is ticked at first.
		await expect(choice.getByLabel(`Carried ${stamp}`).isChecked()).resolves.toBe(true);
		await expect(choice.getByLabel(`Tried only ${stamp}`).isChecked()).resolves.toBe(true);
		await choice.getByLabel(`Tried only ${stamp}`).uncheck();
		await choice.scrollIntoViewIfNeeded();
		await screenshot(page, 'assessment-custom-choice');
		await page.getByLabel('Title').fill(`Chosen populations ${stamp}`);
		await Promise.all([
			page.waitForURL(/\/assessments\/\d+$/),
			page.getByRole('button', { name: 'Save as a draft' }).click()
		]);
		const assessmentId = Number(page.url().split('/').pop());
		saved.push(assessmentId);
		const response = await page.request.get(`/api/v1/assessments/${assessmentId}`);
		const body = (await response.json()) as {
			assessment: { snapshot: { custom: { custom: { id: number } }[] } };
		};
		const ids = body.assessment.snapshot.custom.map((c) => c.custom.id);
		expect(ids).toContain(kept);
		expect(ids).not.toContain(dropped);
		await sequelize.query('DELETE FROM custom_populations WHERE id IN (?, ?)', {
			replacements: [kept, dropped]
		});
	});
});
