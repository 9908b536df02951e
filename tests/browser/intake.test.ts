import { mkdirSync } from 'node:fs';
import type { Browser, Page } from 'playwright-core';
import type { Sequelize } from 'sequelize';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { launchChromium, SCREENSHOT_DIR } from '../helpers/browser';
import { appUrl } from '../helpers/env';
import { actorFor, countReadings, freshSurvey, testSequelize } from '../helpers/intake';
import { DEMO_PASSWORD, DEMO_USERS } from '../helpers/session';
import { screenshot } from '../helpers/pages';

/** Opens a fresh draft member's edit page, at `width` px, from its survey's member list. */
async function openMemberEdit(page: Page, width: number, height: number) {
	const { survey, members } = await freshSurvey(await actorFor(DEMO_USERS.surveyor), ['D-01']);
	await page.setViewportSize({ width, height });
	await page.goto(`${appUrl()}/surveys/${survey.id}`, { waitUntil: 'networkidle' });
	await Promise.all([
		page.waitForURL(`**/members/${members[0].id}/edit`),
		page.getByRole('link', { name: 'Edit member D-01' }).click()
	]);
	await page.waitForLoadState('networkidle');
	return members[0];
}

/** Saves the form and waits for the member's entry page it sends the browser to, saying so. */
async function save(page: Page, memberId: number) {
	await Promise.all([
		page.waitForURL(new RegExp(`/members/${memberId}/entry\\?saved=member$`)),
		page.getByRole('button', { name: 'Save member' }).click()
	]);
}

describe('intake pages in chromium (the built app)', () => {
	let browser: Browser;
	let page: Page;
	let sequelize: Sequelize;
	beforeAll(async () => {
		mkdirSync(SCREENSHOT_DIR, { recursive: true });
		sequelize = testSequelize();
		browser = await launchChromium();
		page = await browser.newPage({ viewport: { width: 1280, height: 900 } });
		await page.goto(`${appUrl()}/sign-in`, { waitUntil: 'networkidle' });
		await page.fill('input[name=email]', DEMO_USERS.surveyor);
		await page.fill('input[name=password]', DEMO_PASSWORD);
		await Promise.all([page.waitForURL(/dashboard/), page.click('button[type=submit]')]);
	});
	afterAll(async () => {
		await browser?.close();
		await sequelize?.close();
	});

	it('lists assets', async () => {
		await page.goto(`${appUrl()}/assets`, { waitUntil: 'networkidle' });
		await expect(page.getByRole('heading', { name: 'Assets' }).isVisible()).resolves.toBe(true);
		expect(await page.locator('table tbody tr').count()).toBeGreaterThan(0);
		await page.screenshot({ path: `${SCREENSHOT_DIR}/intake-assets.png`, fullPage: true });
	});

	it('imports a CSV through the import panel, with the suggested mapping', async () => {
		const actor = await actorFor(DEMO_USERS.surveyor);
		const { survey } = await freshSurvey(actor);
		await page.goto(`${appUrl()}/surveys/${survey.id}`, { waitUntil: 'networkidle' });
		await page.setInputFiles('#import-file', {
			name: 'site-log.csv',
			mimeType: 'text/csv',
			buffer: Buffer.from(
				'Member;X (mm);Y (mm);Cover (mm)\nM-01;0;0;31,5\nM-02;150;0;29,0\nM-03;300;0;33,5\n'
			)
		});
		await page.getByRole('button', { name: 'Upload and preview' }).click();
		await page.getByRole('button', { name: 'Check and import' }).waitFor();
		expect(await page.locator('#map-cover').inputValue()).toBe('3');
		await page.screenshot({ path: `${SCREENSHOT_DIR}/intake-mapping.png`, fullPage: true });
		await page.getByRole('button', { name: 'Check and import' }).click();
		await page.getByText('3 readings imported.').waitFor({ timeout: 20_000 });
		expect(await countReadings(sequelize, { surveyId: survey.id })).toBe(3);
		await page.screenshot({ path: `${SCREENSHOT_DIR}/intake-survey.png`, fullPage: true });
	});

	it('enters readings in the grid, refusing a bad cell as you type, at tablet width', async () => {
		const actor = await actorFor(DEMO_USERS.surveyor);
		const { members } = await freshSurvey(actor);
		await page.setViewportSize({ width: 820, height: 1100 });
		await page.goto(`${appUrl()}/members/${members[0].id}/entry`, { waitUntil: 'networkidle' });
		await page.fill('#cell-0-2', '31.5');
		await page.keyboard.press('Enter');
		await page.keyboard.type('abc');
		await page.getByText('Row 2: Cover (mm) is not a number').waitFor();
		expect(await page.getByRole('button', { name: /Save 2 readings/ }).isDisabled()).toBe(true);
		await page.fill('#cell-1-2', '29');
		await page.getByRole('button', { name: 'Save 2 readings' }).click();
		await page.getByText('2 readings saved.').waitFor();
		expect(await countReadings(sequelize, { surveyId: members[0].surveyId })).toBe(2);
		await page.screenshot({ path: `${SCREENSHOT_DIR}/intake-member-tablet.png`, fullPage: true });
	});

	it('at 1280 px: a new c_min typed and saved is what the member shows', async () => {
		const member = await openMemberEdit(page, 1280, 900);
		expect(await page.inputValue('#field-cMinMm')).toBe('25');
		// 20 + Δc_dev 10 stays within c_nom 35 mm (EN 1992-1-1 (4.1)); 30 would not.
		await page.fill('#field-cMinMm', '20');
		await screenshot(page, 'edit-member-desktop');
		await save(page, member.id);
		await page.getByText('20 / 35 mm').waitFor();
		expect(await page.getByRole('status').textContent()).toContain(
			"The member's specified values were saved."
		);
		expect((await member.reload()).cMinMm).toBe(20);
		await screenshot(page, 'edit-member-saved-desktop');
	});

	it('at tablet width: the EN suggestion for XD1 fills c_min and c_nom, and saving keeps them', async () => {
		const member = await openMemberEdit(page, 820, 1180);
		await page.fill('#field-exposureClass', 'XD1');
		await page.getByRole('button', { name: /Suggest c_min and c_nom/ }).click();
		// EN 1992-1-1 Table 4.4N, structural class S4: XD1 → c_min,dur 35 mm; c_nom = c_min + Δc_dev.
		await page.getByText(/4\.4N/).waitFor();
		expect(await page.inputValue('#field-cMinMm')).toBe('35');
		expect(await page.inputValue('#field-cNomMm')).toBe('45');
		await screenshot(page, 'edit-member-tablet');
		await save(page, member.id);
		await page.getByText('35 / 45 mm').waitFor();
		await member.reload();
		expect([member.exposureClass, member.cMinMm, member.cNomMm]).toEqual(['XD1', 35, 45]);
	});

	it('the EN suggestion takes the Δc_dev typed: XD1 with 5 mm gives c_nom 40 mm, and it saves', async () => {
		const member = await openMemberEdit(page, 1280, 900);
		await page.fill('#field-exposureClass', 'XD1');
		await page.fill('#field-deltaCDevMm', '5');
		await page.getByRole('button', { name: /Suggest c_min and c_nom/ }).click();
		// EN 1992-1-1 Table 4.4N, S4: XD1 → c_min 35 mm; (4.1): c_nom = 35 + 5 = 40 mm.
		await page.getByText(/Δc_dev 5 mm/).waitFor();
		expect(await page.inputValue('#field-cNomMm')).toBe('40');
		await save(page, member.id);
		await member.reload();
		expect([member.cMinMm, member.cNomMm, member.deltaCDevMm]).toEqual([35, 40, 5]);
	});

	it('a c_nom below c_min + Δc_dev is refused under the c_nom field, and nothing is saved', async () => {
		const member = await openMemberEdit(page, 1280, 900);
		await page.fill('#field-cNomMm', '30');
		await page.getByRole('button', { name: 'Save member' }).click();
		const fieldError = page.locator('#field-cNomMm-error');
		await fieldError.waitFor();
		expect(await fieldError.textContent()).toBe(
			'c_nom 30 mm is below c_min + Δc_dev = 35 mm (EN 1992-1-1 (4.1)).'
		);
		expect((await member.reload()).cNomMm).toBe(35);
	});
});
