import { Validator } from '@seriousme/openapi-schema-validator';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Sequelize } from 'sequelize';
import { Asset, Member, Survey } from '../../../src/lib/server/db/models';
import { ENDPOINTS } from '../../../src/lib/server/api/openapi/document';
import type { Endpoint } from '../../../src/lib/server/api/openapi/endpoint';
import { can } from '../../../src/lib/server/policy';
import { testSequelize } from '../../helpers/database';
import { appUrl } from '../../helpers/env';
import { identifyingTextsIn } from '../../helpers/research';
import { anonymousClient, type HttpClient } from '../../helpers/session';
import { tokenFor } from '../../helpers/tokens';

let sequelize: Sequelize;
let researcher: HttpClient;
let admin: HttpClient;
const ids: Record<string, number> = {};

function clientFor(endpoint: Endpoint): HttpClient {
	if (!endpoint.action) return anonymousClient();
	if (can('researcher', endpoint.action)) return researcher;
	if (can('admin', endpoint.action)) return admin;
	throw new Error(`no demo client may ${endpoint.action}`);
}

function examplePath(endpoint: Endpoint): string {
	const path = endpoint.path.replace(/\{(\w+)\}/g, (_, name: string) => String(ids[name]));
	return endpoint.exampleQuery ? `${path}?${endpoint.exampleQuery}` : path;
}

async function call(endpoint: Endpoint): Promise<Response> {
	const client = clientFor(endpoint);
	const path = examplePath(endpoint);
	if (endpoint.method === 'put') return client.putJson(path, endpoint.exampleBody);
	return client.get(path, { accept: endpoint.response.mediaType });
}

beforeAll(async () => {
	sequelize = testSequelize();
	researcher = (await tokenFor('researcher')).client;
	admin = (await tokenFor('admin')).client;
	const carPark = await Asset.findOne({ where: { name: 'Brackenfield Multi-storey Car Park' } });
	const survey = await Survey.findOne({ where: { assetId: carPark!.id } });
	const member = await Member.findOne({ where: { surveyId: survey!.id } });
	Object.assign(ids, { assetId: carPark!.id, surveyId: survey!.id, memberId: member!.id });
	const exported = await researcher.get('/api/v1/research/exports/readings.jsonl?memberType=wall');
	await exported.text();
	ids.exportId = Number(exported.headers.get('x-research-export-id'));
});
afterAll(() => sequelize.close());

describe('the OpenAPI document', () => {
	it('validates as OpenAPI 3.1 with @seriousme/openapi-schema-validator', async () => {
		const response = await fetch(`${appUrl()}/api/v1/openapi.json`);
		expect(response.status).toBe(200);
		const document = await response.json();
		const validator = new Validator();
		const result = await validator.validate(document);
		expect(result.errors ?? []).toEqual([]);
		expect(result.valid).toBe(true);
		expect(validator.version).toBe('3.1');
		expect(Object.keys(document.paths).length).toBeGreaterThanOrEqual(14);
	});

	it.each(ENDPOINTS.map((e) => [`${e.method.toUpperCase()} ${e.path}`, e] as const))(
		'%s answers as documented for its example',
		async (_name, endpoint) => {
			const response = await call(endpoint);
			const body = await response.text();
			expect(response.status, body.slice(0, 300)).toBe(200);
			expect(response.headers.get('content-type')).toContain(endpoint.response.mediaType);
			if (endpoint.response.schema) endpoint.response.schema.parse(JSON.parse(body));
			else expect(body.length).toBeGreaterThan(0);
			if (endpoint.tag === 'Research') expect(identifyingTextsIn(body)).toEqual([]);
			for (const header of Object.keys(endpoint.headers ?? {}))
				expect(response.headers.get(header), header).toBeTruthy();
		}
	);

	it('answers every documented route with the documented error shape when signed out', async () => {
		for (const endpoint of ENDPOINTS.filter((e) => e.action)) {
			const response = await anonymousClient().get(examplePath(endpoint), {
				accept: 'application/json'
			});
			expect(response.status, endpoint.path).toBe(401);
			const body = await response.json();
			expect(body.error.code).toBe('unauthenticated');
		}
	});
});
