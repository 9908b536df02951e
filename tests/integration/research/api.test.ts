import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Sequelize } from 'sequelize';
import { Asset } from '../../../src/lib/server/db/models';
import { testSequelize } from '../../helpers/database';
import { unsharedAsset } from '../../helpers/actors';
import { identifyingTextsIn } from '../../helpers/research';
import { startBuiltApp } from '../../helpers/server';
import { signInAs, tokenClient, type HttpClient } from '../../helpers/session';
import { tokenFor } from '../../helpers/tokens';

let sequelize: Sequelize;
let researcher: HttpClient;
let researcherSecret: string;
let admin: HttpClient;

beforeAll(async () => {
	sequelize = testSequelize();
	({ client: researcher, secret: researcherSecret } = await tokenFor('researcher'));
	admin = (await tokenFor('admin')).client;
});
afterAll(() => sequelize.close());

async function assetRefs(): Promise<Set<string>> {
	const response = await researcher.get('/api/v1/research/members', { accept: 'application/json' });
	const { members } = (await response.json()) as { members: { assetRef: string }[] };
	return new Set(members.map((m) => m.assetRef));
}

describe('research API over HTTP', () => {
	it('pages through every reading with the cursor, and the pages add up to the statistics', async () => {
		let cursor: string | null = null;
		let total = 0;
		const seen = new Set<string>();
		do {
			const query: string = `/api/v1/research/readings?limit=2500${cursor ? `&cursor=${cursor}` : ''}`;
			const response = await researcher.get(query, { accept: 'application/json' });
			expect(response.status).toBe(200);
			const page = (await response.json()) as {
				readings: { memberRef: string }[];
				nextCursor: string | null;
			};
			total += page.readings.length;
			for (const r of page.readings) seen.add(r.memberRef);
			cursor = page.nextCursor;
		} while (cursor);
		const stats = await (
			await researcher.get('/api/v1/research/statistics', { accept: 'application/json' })
		).json();
		expect(total).toBe(stats.selection.readingCount);
		expect(seen.size).toBe(stats.selection.memberCount);
	});

	it('refuses a bad filter with 400 naming the field', async () => {
		for (const [query, field] of [
			['decade=1995', 'decade'],
			['memberType=tunnel', 'memberType'],
			['limit=0', 'limit'],
			['cursor=not-a-cursor', 'cursor']
		]) {
			const response = await researcher.get(`/api/v1/research/readings?${query}`, {
				accept: 'application/json'
			});
			expect(response.status, query).toBe(400);
			const body = await response.json();
			expect(body.error.code).toBe('invalid_input');
			expect(body.error.field).toBe(field);
		}
	});

	it("keeps a researcher out of organisations' own records and consent (403)", async () => {
		for (const path of ['/api/v1/assets', '/api/v1/assets/1/research-consent']) {
			const response = await researcher.get(path, { accept: 'application/json' });
			expect(response.status, path).toBe(403);
			expect((await response.json()).error.code).toBe('forbidden');
		}
	});

	it('answers 404, not 403, for an asset the caller cannot see', async () => {
		const unsharedId = await unsharedAsset(sequelize, `research-api${Date.now()}`);
		const owner = await signInAs('owner');
		const seen = await (await owner.get('/api/v1/assets', { accept: 'application/json' })).json();
		expect(seen.assets.map((a: { id: number }) => a.id)).not.toContain(unsharedId);
		// A route the owner's role may use (assessments); survey routes are refused by role first.
		const response = await owner.get(`/api/v1/assets/${unsharedId}/assessments`, {
			accept: 'application/json'
		});
		expect(response.status).toBe(404);
		expect((await response.json()).error.code).toBe('not_found');
	});

	it('lets the owning admin opt an asset out through the API, and the next export drops it', async () => {
		const office = await Asset.findOne({ where: { name: 'Orchard Row Office Building' } });
		const before = await assetRefs();
		const put = await admin.putJson(`/api/v1/assets/${office!.id}/research-consent`, {
			researchOptIn: false
		});
		expect(put.status).toBe(200);
		expect((await put.json()).researchOptIn).toBe(false);
		try {
			const after = await assetRefs();
			expect(after.size).toBe(before.size - 1);
			const csv = await (await researcher.get('/api/v1/research/exports/readings.csv')).text();
			const officeRef = [...before].find((ref) => !after.has(ref))!;
			expect(csv).not.toContain(officeRef);
			expect(identifyingTextsIn(csv)).toEqual([]);
		} finally {
			await admin.putJson(`/api/v1/assets/${office!.id}/research-consent`, { researchOptIn: true });
		}
		const bad = await admin.putJson(`/api/v1/assets/${office!.id}/research-consent`, {
			researchOptIn: 'yes'
		});
		expect(bad.status).toBe(400);
		expect((await bad.json()).error.field).toBe('researchOptIn');
	});

	it('records each export with its row count and serves its manifest', async () => {
		const response = await researcher.get(
			'/api/v1/research/exports/readings.jsonl?memberType=slab'
		);
		const lines = (await response.text()).trim().split('\n');
		const id = response.headers.get('x-research-export-id');
		const manifest = await (
			await researcher.get(`/api/v1/research/exports/${id}`, { accept: 'application/json' })
		).json();
		expect(manifest.export.rowCount).toBe(lines.length);
		expect(manifest.export.filter.memberType).toEqual(['slab']);
		expect(manifest.citation).toContain(`export ${id}`);
		expect(manifest.dictionary.$defs.ResearchReading.properties.deviationMm.type).toBe('number');
	});
});

describe('rate limits shared by several app processes', () => {
	it('counts in MariaDB: two processes together allow the limit, then 429 with Retry-After', async () => {
		const settings = { API_RATE_LIMIT: '6', API_RATE_WINDOW_SECONDS: '86400' };
		const [one, two] = await Promise.all([startBuiltApp(settings), startBuiltApp(settings)]);
		try {
			// A fresh user bucket: a token of its own would still be the researcher, so count first.
			const clients = [
				tokenClient(researcherSecret, one.origin),
				tokenClient(researcherSecret, two.origin)
			];
			const statuses: number[] = [];
			for (let i = 0; i < 12; i++) {
				const response = await clients[i % 2].get('/api/v1/research/dictionary', {
					accept: 'application/json'
				});
				statuses.push(response.status);
				if (response.status === 429) {
					expect(Number(response.headers.get('retry-after'))).toBeGreaterThan(0);
					expect((await response.json()).error.code).toBe('too_many_requests');
				} else await response.body?.cancel();
			}
			const allowed = statuses.filter((s) => s === 200).length;
			expect(allowed).toBe(6);
			expect(statuses.slice(-6)).toEqual([429, 429, 429, 429, 429, 429]);
		} finally {
			await Promise.all([one.stop(), two.stop()]);
		}
	});
});
