import sharp from 'sharp';
import { QueryTypes, type Sequelize } from 'sequelize';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Attachment } from '../../src/lib/server/db/models';
import { actorFor, freshSurvey, testSequelize } from '../helpers/intake';
import { startBuiltApp } from '../helpers/server';
import { signInAs, type HttpClient } from '../helpers/session';
import { ownStorageFake, silentStorage } from '../helpers/storageFake';

type App = Awaited<ReturnType<typeof startBuiltApp>>;

// What the app says when object storage cannot be reached (src/lib/server/domainErrors.ts).
const STORAGE_DOWN =
	'File storage cannot be reached right now, so the file was not saved and nothing was recorded. Try again in a few minutes.';

/** A request that has not been answered in this long is hung: the test fails rather than waits. */
const HANG_MS = 20_000;

function upload(app: App, client: HttpClient, surveyId: number, fileName: string, body: Buffer) {
	const query = new URLSearchParams({ fileName, kind: 'photo' });
	return fetch(`${app.origin}/api/v1/surveys/${surveyId}/attachments?${query}`, {
		method: 'POST',
		headers: {
			cookie: client.cookie,
			origin: app.origin,
			accept: 'application/json',
			'content-type': 'application/octet-stream'
		},
		body: new Uint8Array(body),
		signal: AbortSignal.timeout(HANG_MS)
	});
}

async function uploadAudits(sequelize: Sequelize, fileName: string): Promise<number> {
	const [row] = await sequelize.query<{ n: number }>(
		`SELECT COUNT(*) AS n FROM audit_events
		 WHERE action = 'attachment.uploaded' AND JSON_VALUE(detail, '$.fileName') = ?`,
		{ replacements: [fileName], type: QueryTypes.SELECT }
	);
	return Number(row.n);
}

function photo(): Promise<Buffer> {
	return sharp({ create: { width: 640, height: 480, channels: 3, background: '#7a8a80' } })
		.png()
		.toBuffer();
}

describe('when the object-storage fake goes down under a running app', () => {
	let sequelize: Sequelize;
	let storage: Awaited<ReturnType<typeof ownStorageFake>>;
	let app: App;
	let surveyor: HttpClient;

	beforeAll(async () => {
		sequelize = testSequelize();
		storage = await ownStorageFake();
		await storage.start();
		app = await startBuiltApp({ S3_ENDPOINT: storage.endpoint });
		surveyor = await signInAs('surveyor', app.origin);
	});

	afterAll(async () => {
		await app?.stop();
		await storage?.remove();
		await sequelize?.close();
	});

	it('refuses an upload with a plain 503, records nothing, and takes uploads again once it is back', async () => {
		const { survey } = await freshSurvey(await actorFor('surveyor@kestrel-lane.example'));
		const image = await photo();
		// Up: an upload works, and the app now holds open connections to the fake.
		const first = await upload(app, surveyor, survey.id, `bay-1-${survey.id}.png`, image);
		expect(first.status).toBe(201);
		const { attachment: kept } = await first.json();
		const keysBefore = await storage.keys(`attachments/${survey.id}/`);
		expect(keysBefore).toEqual([kept.storageKey, kept.thumbnailKey].sort());

		await storage.stop();
		const refused = await upload(
			app,
			surveyor,
			survey.id,
			`bay-2-storage-down-${survey.id}.png`,
			image
		);
		expect(refused.status).toBe(503);
		expect(await refused.json()).toEqual({
			error: { code: 'storage_unavailable', message: STORAGE_DOWN }
		});
		// Nothing half-recorded: no row, no audit event claiming the upload.
		expect(await Attachment.count({ where: { surveyId: survey.id } })).toBe(1);
		expect(await uploadAudits(sequelize, `bay-2-storage-down-${survey.id}.png`)).toBe(0);
		// Operators see why in the app's log.
		expect(app.output()).toMatch(/object storage unavailable \(PUT attachments\/\d+\/[0-9a-f-]+\)/);
		// A download while it is down is the same plain answer, not a 500.
		const download = await surveyor.get(`/api/v1/attachments/${kept.id}`);
		expect(download.status).toBe(503);
		expect((await download.json()).error.code).toBe('storage_unavailable');

		// Back, in the same app process: no orphan object from the refused upload...
		await storage.start();
		expect(await storage.keys(`attachments/${survey.id}/`)).toEqual(keysBefore);
		// ...and uploads work again without a restart.
		const again = await upload(app, surveyor, survey.id, `bay-2-${survey.id}.png`, image);
		expect(again.status).toBe(201);
		const { attachment } = await again.json();
		const file = await surveyor.get(`/api/v1/attachments/${attachment.id}`);
		expect(file.status).toBe(200);
		expect(Buffer.from(await file.arrayBuffer()).equals(image)).toBe(true);
		expect(await Attachment.count({ where: { surveyId: survey.id } })).toBe(2);
		expect(await uploadAudits(sequelize, `bay-2-${survey.id}.png`)).toBe(1);
		expect(app.output()).not.toContain('Unhandled');
	});
});

describe('when object storage takes connections but never answers', () => {
	let sequelize: Sequelize;
	let storage: Awaited<ReturnType<typeof silentStorage>>;
	let app: App;
	let surveyor: HttpClient;

	beforeAll(async () => {
		sequelize = testSequelize();
		storage = await silentStorage();
		// Short timeouts so the test is quick; production's are in docs/scaling.md, "Timeouts".
		app = await startBuiltApp({
			S3_ENDPOINT: storage.endpoint,
			S3_CONNECT_TIMEOUT_MS: '1000',
			S3_REQUEST_TIMEOUT_MS: '1500'
		});
		surveyor = await signInAs('surveyor', app.origin);
	});

	afterAll(async () => {
		await app?.stop();
		await storage?.close();
		await sequelize?.close();
	});

	it('gives up at its request timeout with the same plain 503 instead of hanging', async () => {
		const { survey } = await freshSurvey(await actorFor('surveyor@kestrel-lane.example'));
		const refused = await upload(
			app,
			surveyor,
			survey.id,
			`bay-3-storage-hung-${survey.id}.png`,
			await photo()
		);
		expect(refused.status).toBe(503);
		expect((await refused.json()).error).toEqual({
			code: 'storage_unavailable',
			message: STORAGE_DOWN
		});
		expect(storage.connectionsSeen()).toBeGreaterThan(0);
		expect(await Attachment.count({ where: { surveyId: survey.id } })).toBe(0);
		expect(await uploadAudits(sequelize, `bay-3-storage-hung-${survey.id}.png`)).toBe(0);
	});
});
