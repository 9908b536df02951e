import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Sequelize } from 'sequelize';
import { Attachment } from '../../../src/lib/server/db/models';
import { signUpNewOrganisation } from '../../helpers/accounts';
import { appUrl } from '../../helpers/env';
import { actorFor, freshSurvey, testSequelize } from '../../helpers/intake';
import { signInAs, type HttpClient } from '../../helpers/session';

function send(
	client: HttpClient,
	surveyId: number,
	query: Record<string, string>,
	body: Uint8Array
) {
	return fetch(`${appUrl()}/api/v1/surveys/${surveyId}/attachments?${new URLSearchParams(query)}`, {
		method: 'POST',
		headers: {
			cookie: client.cookie,
			origin: new URL(appUrl()).origin,
			accept: 'application/json',
			'content-type': 'application/octet-stream'
		},
		body: new Blob([new Uint8Array(body)])
	});
}

describe('attachments in object storage (the S3 fake), through the policy', () => {
	let sequelize: Sequelize;
	let surveyor: HttpClient;
	beforeAll(async () => {
		sequelize = testSequelize();
		surveyor = await signInAs('surveyor');
	});
	afterAll(async () => {
		await sequelize.close();
	});

	it('keeps a photo with a thumbnail, the type judged from the bytes and the name sanitised', async () => {
		const { survey } = await freshSurvey(await actorFor('surveyor@kestrel-lane.example'));
		const png = await sharp({
			create: { width: 800, height: 600, channels: 3, background: '#888888' }
		})
			.png()
			.toBuffer();
		const response = await send(
			surveyor,
			survey.id,
			{ fileName: '../../bay 3\u0000.jpg', kind: 'photo', caption: 'Bay 3' },
			png
		);
		expect(response.status).toBe(201);
		const { attachment } = await response.json();
		expect(attachment).toMatchObject({
			fileName: 'bay 3.jpg',
			contentType: 'image/png',
			byteSize: png.length
		});
		const file = await surveyor.get(`/api/v1/attachments/${attachment.id}`);
		const got = Buffer.from(await file.arrayBuffer());
		expect([file.status, got.length, got.subarray(0, 8).toString('hex')]).toEqual([
			200,
			png.length,
			png.subarray(0, 8).toString('hex')
		]);
		expect(got.equals(png)).toBe(true);
		const thumb = await surveyor.get(`/api/v1/attachments/${attachment.id}?thumbnail=1`);
		const meta = await sharp(Buffer.from(await thumb.arrayBuffer())).metadata();
		expect([meta.format, meta.width, meta.height]).toEqual(['jpeg', 320, 240]);
		const stranger = (await signUpNewOrganisation('attachment-stranger')).client;
		expect((await stranger.get(`/api/v1/attachments/${attachment.id}`)).status).toBe(404);
	});

	it('refuses a type the kind may not hold, recording nothing', async () => {
		const { survey } = await freshSurvey(await actorFor('surveyor@kestrel-lane.example'));
		const html = Buffer.from('<html><script>alert(1)</script></html>');
		const response = await send(
			surveyor,
			survey.id,
			{ fileName: 'photo.png', kind: 'photo' },
			html
		);
		expect(response.status).toBe(400);
		expect((await response.json()).error.message).toBe(
			'A photo cannot be a file of type text/plain.'
		);
		expect(await Attachment.count({ where: { surveyId: survey.id } })).toBe(0);
	});
});
