/**
 * On-site entry in chromium against the built app: the service worker keeps the page and its
 * members, IndexedDB keeps the entries, and they reach the database exactly once when the
 * network returns. A context set offline stands in for a site without signal.
 */
import { mkdirSync, readFileSync } from 'node:fs';
import type { Browser, BrowserContext, Page } from 'playwright-core';
import type { Sequelize } from 'sequelize';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Attachment, SyncBatch, VerificationHole } from '../../src/lib/server/db/models';
import { launchChromium, SCREENSHOT_DIR } from '../helpers/browser';
import { appUrl } from '../helpers/env';
import { actorFor, countReadings, freshSurvey, testSequelize } from '../helpers/intake';
import { submitSurvey } from '../helpers/editing';
import { DEMO_PASSWORD, DEMO_USERS, signInAs } from '../helpers/session';
import { until } from '../helpers/until';

// A 1×1 PNG (signature, IHDR, IDAT, IEND): the smallest photo the upload accepts.
const PNG = Buffer.from(
	'iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mP8z8BQDwAEhQGAhKmMIQAAAABJRU5ErkJggg==',
	'base64'
);

async function signedInContext(browser: Browser, width: number, height: number) {
	const context = await browser.newContext({
		baseURL: appUrl(),
		viewport: { width, height },
		hasTouch: true,
		acceptDownloads: true
	});
	const page = await context.newPage();
	await page.request.get('/api/health');
	await signInOn(page);
	return { context, page };
}

async function signInOn(page: Page, next = '', email: string = DEMO_USERS.surveyor) {
	await page.goto(`/sign-in${next ? `?next=${encodeURIComponent(next)}` : ''}`);
	await page.waitForLoadState('networkidle');
	await page.fill('input[name=email]', email);
	await page.fill('input[name=password]', DEMO_PASSWORD);
	await Promise.all([
		page.waitForURL(next ? `**${next}` : '**/dashboard'),
		page.click('form button')
	]);
}

/** Opens a survey's site page and waits until its service worker controls it. */
async function openSitePage(page: Page, surveyId: number) {
	await page.goto(`/surveys/${surveyId}/site`, { waitUntil: 'networkidle' });
	await page.evaluate(() => navigator.serviceWorker.ready.then(() => undefined));
	// Loaded once more under the worker, so that it has the page in its cache.
	await page.reload({ waitUntil: 'networkidle' });
	expect(await page.evaluate(() => !!navigator.serviceWorker.controller)).toBe(true);
}

async function addReading(page: Page, cover: string, diameter = '') {
	await page.getByLabel('Cover (mm)').fill(cover);
	await page.getByLabel('Bar ⌀ estimate (mm)').fill(diameter);
	await page.getByRole('button', { name: 'Add reading' }).click();
	await expect.poll(() => page.getByLabel('Cover (mm)').inputValue()).toBe('');
}

const waitingText = (page: Page) => page.getByTestId('waiting').innerText();

describe('on-site entry, offline and back (chromium, the built app)', () => {
	let browser: Browser;
	let sequelize: Sequelize;
	const contexts: BrowserContext[] = [];
	beforeAll(async () => {
		mkdirSync(SCREENSHOT_DIR, { recursive: true });
		sequelize = testSequelize();
		browser = await launchChromium();
	});
	afterAll(async () => {
		for (const c of contexts) await c.close();
		await browser?.close();
		await sequelize?.close();
	});

	it('keeps readings, a hole and a photo offline, through a reload, and saves them once', async () => {
		const actor = await actorFor(DEMO_USERS.surveyor);
		const { survey, members } = await freshSurvey(actor, ['G-01', 'G-02']);
		const { context, page } = await signedInContext(browser, 390, 844);
		contexts.push(context);
		const sent: string[] = [];
		page.on('request', (r) => {
			if (r.method() === 'POST' && r.url().endsWith('/site-sync')) sent.push(r.postData() ?? '');
		});
		await openSitePage(page, survey.id);

		// Touch targets of at least 44 px (WCAG 2.2 success criterion 2.5.5, target size).
		const heights = await page
			.locator('section form input, section form button, section[aria-labelledby=members] button')
			.evaluateAll((els) => els.map((e) => e.getBoundingClientRect().height));
		expect(heights.length).toBeGreaterThan(10);
		expect(Math.min(...heights)).toBeGreaterThanOrEqual(44);
		const keypads = await page.locator('input[inputmode=decimal]').count();
		expect(keypads).toBe(8); // x, y, cover, ⌀; the hole's meter, measured, x, y

		await context.setOffline(true);
		await expect.poll(() => page.getByText('Offline', { exact: true }).isVisible()).toBe(true);
		await addReading(page, '31.5', '19.3');
		await addReading(page, '28');
		await page.getByRole('button', { name: /^G-02/ }).click();
		await addReading(page, '40.2', '11');
		expect(await waitingText(page)).toBe('3 readings waiting to send');
		// The running count per member: G-01 has two waiting, G-02 one.
		await expect
			.poll(() => page.getByTestId('member-count').allInnerTexts())
			.toEqual(['2 readings (2 waiting)', '1 reading (1 waiting)']);

		await page.getByLabel('Hole label').fill('K1');
		await page.getByLabel('Meter (mm)').fill('31');
		await page.getByLabel('Measured (mm)').fill('33.5');
		await page.getByRole('button', { name: 'Add check hole' }).click();
		await page.getByLabel('Photo', { exact: true }).setInputFiles({
			name: 'bay-3.png',
			mimeType: 'image/png',
			buffer: PNG
		});
		await page.getByLabel('Caption').fill('Bay 3, soffit');
		await page.getByRole('button', { name: 'Add photo' }).click();
		await expect.poll(() => waitingText(page)).toMatch(/, and 2 holes or photos$/);
		await page.evaluate(() => scrollTo(0, 0));
		await page.screenshot({ path: `${SCREENSHOT_DIR}/site-entry-390-offline.png`, fullPage: true });

		// Reloaded with no network: the worker answers with the page, IndexedDB with the entries.
		await page.reload({ waitUntil: 'load' });
		await expect.poll(() => waitingText(page)).toMatch(/^3 readings waiting to send/);
		expect(await page.getByRole('button', { name: /^G-01/ }).isVisible()).toBe(true);
		expect(sent).toHaveLength(0);
		expect(await countReadings(sequelize, { surveyId: survey.id })).toBe(0);

		await context.setOffline(false);
		await page.evaluate(() => dispatchEvent(new Event('online')));
		await expect
			.poll(() => waitingText(page), { timeout: 15000 })
			.toBe('0 readings waiting to send');
		expect(await countReadings(sequelize, { surveyId: survey.id })).toBe(3);
		// The hole and the photo were taken on G-02, the member chosen at the time.
		expect(await VerificationHole.count({ where: { memberId: members[1].id } })).toBe(1);
		const photos = await Attachment.findAll({ where: { surveyId: survey.id } });
		expect(photos.map((p) => [p.kind, p.caption, p.memberId])).toEqual([
			['photo', 'Bay 3, soffit', members[1].id]
		]);
		// The estimate of 19.3 mm was rounded to the 20 mm bar (EN 10080 stock) as typed.
		const [reading] = await sequelize.query<{ d: number; note: string }>(
			'SELECT bar_diameter_mm AS d, note FROM readings WHERE member_id = ? AND cover_mm = 31.5',
			{ replacements: [members[0].id], type: 'SELECT' as never }
		);
		expect(reading).toEqual({ d: 20, note: 'meter ⌀ 19.3 mm' });
		await expect
			.poll(() => page.getByTestId('member-count').allInnerTexts())
			.toEqual(['2 readings', '1 reading']);

		// The same batch sent again (a retry whose answer was lost) adds nothing.
		expect(sent).toHaveLength(1);
		const again = await page.evaluate(
			async ([path, body]) => {
				const r = await fetch(path, {
					method: 'POST',
					headers: { 'content-type': 'application/json' },
					body
				});
				return { status: r.status, body: await r.json() };
			},
			[`/api/v1/surveys/${survey.id}/site-sync`, sent[0]] as const
		);
		expect(again).toMatchObject({ status: 200, body: { received: 'earlier', readings: 3 } });
		expect(await countReadings(sequelize, { surveyId: survey.id })).toBe(3);
		expect(await SyncBatch.count({ where: { surveyId: survey.id } })).toBe(2); // entries, photo
		await page.evaluate(() => scrollTo(0, 0));
		await page.screenshot({ path: `${SCREENSHOT_DIR}/site-entry-390-sent.png`, fullPage: true });
	});

	it('keeps entries a submitted survey refuses, says why, and offers them as CSV', async () => {
		const actor = await actorFor(DEMO_USERS.surveyor);
		const { survey } = await freshSurvey(actor, ['R-01']);
		const { context, page } = await signedInContext(browser, 820, 1180);
		contexts.push(context);
		await openSitePage(page, survey.id);
		await context.setOffline(true);
		await addReading(page, '33');
		await page.getByLabel('Bar ⌀ estimate (mm)').fill('20.7');
		expect(await page.getByTestId('bar-rounded').innerText()).toBe(
			'→ 20 mm bar (nearest of EN 10080 bar sizes)'
		);
		await page.getByLabel('Bar ⌀ estimate (mm)').fill('');
		await page.evaluate(() => scrollTo(0, 0));
		await page.screenshot({ path: `${SCREENSHOT_DIR}/site-entry-820-offline.png`, fullPage: true });
		// A cover that is not a number is caught as typed (the entry grid's own cell checks).
		await page.getByLabel('Cover (mm)').fill('=1+2');
		expect(await page.getByRole('button', { name: 'Add reading' }).isDisabled()).toBe(true);
		await page.getByLabel('Cover (mm)').fill('');
		expect(await waitingText(page)).toBe('1 reading waiting to send');
		// Meanwhile the survey is submitted from the office.
		// (Submitting needs a reading: the helper enters one first.)
		await submitSurvey(await signInAs('surveyor'), survey.id);
		const readingsAtSubmit = await countReadings(sequelize, { surveyId: survey.id });
		await context.setOffline(false);
		await page.evaluate(() => dispatchEvent(new Event('online')));
		const refusal = page.getByRole('heading', { name: /refused by the server/ });
		await expect.poll(() => refusal.isVisible(), { timeout: 15000 }).toBe(true);
		expect(await page.getByText('The survey is submitted: its readings are frozen.').count()).toBe(
			1
		);
		expect(await countReadings(sequelize, { surveyId: survey.id })).toBe(readingsAtSubmit);
		const [download] = await Promise.all([
			page.waitForEvent('download'),
			page.getByRole('button', { name: 'Download as CSV' }).click()
		]);
		const text = readFileSync((await download.path())!, 'utf8');
		expect(text.split('\r\n')).toEqual([
			'member,kind,x,y,cover,diameter,direction,note,reason',
			'R-01,reading,,,33,,,,The survey is submitted: its readings are frozen. An engineer can return it for changes.',
			''
		]);
		// Still on the device after a reload.
		await page.reload({ waitUntil: 'networkidle' });
		await expect.poll(() => refusal.isVisible()).toBe(true);
		await page.evaluate(() => scrollTo(0, 0));
		await page.screenshot({ path: `${SCREENSHOT_DIR}/site-entry-820-refused.png`, fullPage: true });
	});

	it('asks for a sign-in when the session ended offline, keeps the entries, then sends them', async () => {
		const actor = await actorFor(DEMO_USERS.surveyor);
		const { survey } = await freshSurvey(actor, ['A-01']);
		const { context, page } = await signedInContext(browser, 390, 844);
		contexts.push(context);
		await openSitePage(page, survey.id);
		await context.setOffline(true);
		await addReading(page, '27.5');
		await context.clearCookies(); // the session has ended while the device was away
		await context.setOffline(false);
		await page.evaluate(() => dispatchEvent(new Event('online')));
		const ask = page.getByRole('link', { name: 'Sign in again' });
		await expect.poll(() => ask.isVisible(), { timeout: 15000 }).toBe(true);
		expect(await waitingText(page)).toBe('1 reading waiting to send');
		await page.evaluate(() => scrollTo(0, 0));
		await page.screenshot({ path: `${SCREENSHOT_DIR}/site-entry-390-sign-in.png`, fullPage: true });
		await ask.click();
		await page.waitForURL(/\/sign-in/);
		await signInOn(page, `/surveys/${survey.id}/site`);
		await expect
			.poll(() => waitingText(page), { timeout: 15000 })
			.toBe('0 readings waiting to send');
		await until('the reading saved', async () => {
			return (await countReadings(sequelize, { surveyId: survey.id })) === 1;
		});
	});

	it("keeps a person's entries apart on a shared tablet: never sent under the next sign-in", async () => {
		const surveyor = await actorFor(DEMO_USERS.surveyor);
		const { survey } = await freshSurvey(surveyor, ['T-01']);
		const { context, page } = await signedInContext(browser, 820, 1180);
		contexts.push(context);
		const senders: string[] = [];
		page.on('request', (r) => {
			if (r.method() === 'POST' && r.url().endsWith('/site-sync')) senders.push(r.url());
		});
		await openSitePage(page, survey.id);
		// The server cannot be reached when the reading is sent: it stays on the tablet.
		await context.route('**/site-sync', (route) => route.abort());
		await addReading(page, '29.5');
		expect(await waitingText(page)).toBe('1 reading waiting to send');

		// Signing out says what is still on the device before it goes.
		let asked = '';
		page.once('dialog', (dialog) => {
			asked = dialog.message();
			void dialog.accept();
		});
		await page.getByText(/▾/).click();
		await Promise.all([
			page.waitForURL('**/sign-in'),
			page.getByRole('button', { name: 'Sign out', exact: true }).click()
		]);
		expect(asked).toMatch(/^1 on-site entry on this device has not reached the server yet\./);
		await context.unroute('**/site-sync');

		// The next person on the tablet (the organisation's admin) sees that an entry waits, but
		// neither sees it nor sends it.
		const before = senders.length;
		await signInOn(page, `/surveys/${survey.id}/site`, DEMO_USERS.admin);
		await expect
			.poll(() => page.getByTestId('others-waiting').innerText())
			.toMatch(/^1 entry for this survey was made on this device by someone else\./);
		expect(await waitingText(page)).toBe('0 readings waiting to send');
		expect(await page.getByTestId('kept-entry').count()).toBe(0);
		await page.evaluate(() => dispatchEvent(new Event('online')));
		await page.waitForLoadState('networkidle');
		expect(senders.length).toBe(before);
		expect(await countReadings(sequelize, { surveyId: survey.id })).toBe(0);
		await page.evaluate(() => scrollTo(0, 0));
		await page.screenshot({ path: `${SCREENSHOT_DIR}/site-entry-820-shared.png`, fullPage: true });

		// The surveyor signs in again: the reading goes, received under the surveyor's name.
		page.once('dialog', (dialog) => void dialog.accept());
		await page.getByText(/▾/).click();
		await Promise.all([
			page.waitForURL('**/sign-in'),
			page.getByRole('button', { name: 'Sign out', exact: true }).click()
		]);
		await signInOn(page, `/surveys/${survey.id}/site`);
		await expect
			.poll(() => waitingText(page), { timeout: 15000 })
			.toBe('0 readings waiting to send');
		await until('the reading saved', async () => {
			return (await countReadings(sequelize, { surveyId: survey.id })) === 1;
		});
		const batches = await SyncBatch.findAll({ where: { surveyId: survey.id } });
		expect(batches.map((b) => b.receivedByUserId)).toEqual([surveyor.userId]);
	});
});
