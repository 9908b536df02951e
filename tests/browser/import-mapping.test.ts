import { mkdirSync } from 'node:fs';
import type { Browser, Page } from 'playwright-core';
import type { Sequelize } from 'sequelize';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { launchChromium, SCREENSHOT_DIR } from '../helpers/browser';
import { appUrl } from '../helpers/env';
import { actorFor, countReadings, freshSurvey, testSequelize } from '../helpers/intake';
import { browserSignIn, screenshot } from '../helpers/pages';
import { DEMO_USERS } from '../helpers/session';

const METRES_CSV = [
	'Member,Position (m),Height (m),Cover (mm),Observations',
	'M-01,1.25,0.4,31.5,dry',
	'M-02,2.5,0.4,29,"damp, near joint"',
	'M-09,3.75,0.4,30,not a member of the survey'
].join('\n');

describe('the import mapping page in chromium (the built app)', () => {
	let browser: Browser;
	let page: Page;
	let sequelize: Sequelize;
	beforeAll(async () => {
		mkdirSync(SCREENSHOT_DIR, { recursive: true });
		sequelize = testSequelize();
		browser = await launchChromium();
		page = await browserSignIn(browser, 'surveyor');
	});
	afterAll(async () => {
		await browser?.close();
		await sequelize?.close();
	});

	it('reads "Position (m)" as metres, shows the rows as read, and keeps the choices after a failure', async () => {
		const { survey } = await freshSurvey(await actorFor(DEMO_USERS.surveyor));
		await page.setViewportSize({ width: 1280, height: 900 });
		await page.goto(`${appUrl()}/surveys/${survey.id}`, { waitUntil: 'networkidle' });
		await page.setInputFiles('#import-file', {
			name: 'metres.csv',
			mimeType: 'text/csv',
			buffer: Buffer.from(METRES_CSV)
		});
		await page.getByRole('button', { name: 'Upload and preview' }).click();
		await page.getByRole('button', { name: 'Check and import' }).waitFor();
		expect(await page.getByLabel('x unit').inputValue()).toBe('m');
		expect(await page.getByLabel('Cover unit').inputValue()).toBe('mm');
		// "Observations" is not guessed as the note: the user maps it.
		expect(await page.locator('#map-note').inputValue()).toBe('');
		await page.selectOption('#map-note', '4');
		const asRead = page.getByTestId('preview-as-read');
		await asRead.getByText('damp, near joint').waitFor();
		const firstRow = await asRead.locator('tbody tr').first().innerText();
		expect(firstRow.split('\t')).toEqual(['2', 'M-01', '1250', '400', '31.5', 'dry']);
		expect(await asRead.locator('tbody tr').nth(2).innerText()).toContain(
			'refused: member label "M-09" is not a member of this survey'
		);
		await screenshot(page, 'import-mapping-as-read');
		await page.getByRole('button', { name: 'Check and import' }).click();
		// The whole file is refused (one bad row); the form comes back with the choices made.
		await page.getByText(/Your column choices are kept below/).waitFor({ timeout: 20_000 });
		await page.getByRole('button', { name: 'Check and import' }).waitFor();
		expect(await page.locator('#map-note').inputValue()).toBe('4');
		expect(await page.getByLabel('x unit').inputValue()).toBe('m');
		await screenshot(page, 'import-mapping-kept-after-failure');
		await page.getByLabel('import the valid rows, return the rest').check();
		await page.getByRole('button', { name: 'Check and import' }).click();
		await page.getByText('2 readings imported, 1 rows returned.').waitFor({ timeout: 20_000 });
		expect(await countReadings(sequelize, { surveyId: survey.id })).toBe(2);
	});

	it('offers the measurements import with its columns explained, at tablet width', async () => {
		const { survey } = await freshSurvey(await actorFor(DEMO_USERS.surveyor));
		await page.setViewportSize({ width: 768, height: 1024 });
		await page.goto(`${appUrl()}/surveys/${survey.id}/measurements`, { waitUntil: 'networkidle' });
		await page.setInputFiles('#import-file-chloride', {
			name: 'profiles.csv',
			mimeType: 'text/csv',
			buffer: Buffer.from(
				'Member,Profile,Date,From (mm),To (mm),Chloride (%),Basis\nM-01,P1,2026-02-10,0,5,0.62,binder\nM-01,P1,2026-02-10,5,10,0.48,binder\n'
			)
		});
		await page.getByRole('button', { name: 'Upload and preview' }).nth(1).click();
		await page.getByRole('button', { name: 'Check and import' }).waitFor({ timeout: 60_000 });
		await page.getByText('The columns of this kind of file').waitFor();
		expect(await page.locator('#map-chloridePercent').inputValue()).toBe('5');
		await screenshot(page, 'import-chloride-mapping-tablet');
		await page.getByRole('button', { name: 'Check and import' }).click();
		await page.getByText('1 chloride profile imported from 2 rows.').waitFor({
			timeout: 20_000
		});
		await page.reload({ waitUntil: 'networkidle' });
		await page.getByText('P1').first().waitFor();
		await screenshot(page, 'import-chloride-done-tablet');
	});
});
