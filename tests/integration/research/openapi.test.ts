import { Validator } from '@seriousme/openapi-schema-validator';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Sequelize } from 'sequelize';
import {
	Asset,
	CarbonationTest,
	ChlorideProfile,
	Member,
	Survey,
	VerificationHole
} from '../../../src/lib/server/db/models';
import { ENDPOINTS } from '../../../src/lib/server/api/openapi/document';
import type { Endpoint } from '../../../src/lib/server/api/openapi/endpoint';
import { FROZEN } from '../../../src/lib/server/api/openapi/errors';
import { can } from '../../../src/lib/server/policy';
import { testSequelize } from '../../helpers/database';
import { appUrl } from '../../helpers/env';
import { actorFor, csv, freshSurvey, importFile } from '../../helpers/intake';
import { identifyingTextsIn } from '../../helpers/research';
import { insertMeasurements } from '../../helpers/otherOrganisation';
import { anonymousClient, DEMO_USERS, type HttpClient } from '../../helpers/session';
import { tokenFor } from '../../helpers/tokens';
import { until } from '../../helpers/until';

type Ids = Record<string, number>;
/** The served document, read as plain JSON. */
// eslint-disable-next-line @typescript-eslint/no-explicit-any -- walked by arbitrary paths; the validator has checked its shape
type Json = Record<string, any>;

let sequelize: Sequelize;
let researcher: HttpClient;
let admin: HttpClient;
/** The read examples act on the demo car park. */
const demoIds: Ids = {};
/** Intake's examples act on what the ones before them made: an asset, its survey… */
const intakeIds: Ids = {};

const idsOf = (endpoint: Endpoint) => (endpoint.tag === 'Intake' ? intakeIds : demoIds);

function clientFor(endpoint: Endpoint): HttpClient {
	if (!endpoint.action) return anonymousClient();
	if (can('researcher', endpoint.action)) return researcher;
	if (can('admin', endpoint.action)) return admin;
	throw new Error(`no demo client may ${endpoint.action}`);
}

function examplePath(endpoint: Endpoint, ids: Ids): string {
	const path = endpoint.path.replace(/\{(\w+)\}/g, (_, name: string) => String(ids[name]));
	return endpoint.exampleQuery ? `${path}?${endpoint.exampleQuery}` : path;
}

/** Calls `endpoint` as documented: its method, its example query and body (JSON or a file). */
async function call(
	endpoint: Endpoint,
	client = clientFor(endpoint),
	ids = idsOf(endpoint),
	body = endpoint.exampleBody
): Promise<Response> {
	const path = examplePath(endpoint, ids);
	const { file } = endpoint;
	if (endpoint.method === 'get') return client.get(path, { accept: endpoint.response.mediaType! });
	if (endpoint.method === 'delete') return client.delete(path);
	if (endpoint.method === 'put') return client.putJson(path, body);
	if (endpoint.method === 'patch') return client.patchJson(path, body);
	if (file) return client.postBody(path, file.example.text, file.example.contentType);
	return endpoint.body ? client.postJson(path, body) : client.postBody(path);
}

/** Keeps the ids a created record's answer gives, for the examples after it. */
function remember(answer: Record<string, unknown>) {
	for (const [key, value] of Object.entries(answer)) {
		const id = (value as { id?: unknown } | null)?.id;
		if (key === 'batchId' && typeof value === 'number') intakeIds.batchId = value;
		else if (typeof id === 'number') intakeIds[`${key}Id`] = id;
	}
}

const byId = (operationId: string) => ENDPOINTS.find((e) => e.operationId === operationId)!;

/** Steps the intake examples need that are not documented calls of their own. */
const BEFORE: Record<string, () => Promise<void>> = {
	// The refused rows (and the undo after them) need the started import to have finished.
	importRejectedRows: async () => {
		await until('the example import to finish', async () => {
			const status = await (await admin.get(`/api/v1/imports/${intakeIds.batchId}`)).json();
			return status.import.state !== 'running';
		});
	},
	// Only a pending or running import can be cancelled: the file uploaded again is one.
	cancelImport: async () => {
		intakeIds.batchId = (await (await call(byId('uploadImport'))).json()).batchId;
	},
	// A population of the car park's own to rename (to the example's name) and then delete.
	renameCustomPopulation: async () => {
		const name = (byId('renameCustomPopulation').exampleBody as { name: string }).name;
		await sequelize.query('DELETE FROM custom_populations WHERE asset_id = ? AND name = ?', {
			replacements: [demoIds.assetId, name]
		});
		const made = await admin.postJson(`/api/v1/assets/${demoIds.assetId}/populations/custom`, {
			name: `Example ${Date.now()}`,
			members: [demoIds.memberId]
		});
		demoIds.customId = ((await made.json()) as { population: { id: number } }).population.id;
	}
};

beforeAll(async () => {
	sequelize = testSequelize();
	researcher = (await tokenFor('researcher')).client;
	admin = (await tokenFor('admin')).client;
	const carPark = await Asset.findOne({ where: { name: 'Brackenfield Multi-storey Car Park' } });
	const survey = await Survey.findOne({ where: { assetId: carPark!.id } });
	const member = await Member.findOne({ where: { surveyId: survey!.id } });
	Object.assign(demoIds, { assetId: carPark!.id, surveyId: survey!.id, memberId: member!.id });
	const exported = await researcher.get('/api/v1/research/exports/readings.jsonl?memberType=wall');
	await exported.text();
	demoIds.exportId = Number(exported.headers.get('x-research-export-id'));
});
afterAll(() => sequelize.close());

async function servedDocument() {
	const response = await fetch(`${appUrl()}/api/v1/openapi.json`);
	expect(response.status).toBe(200);
	return response.json();
}

/** The top-level fields a request body's documented schema names (through $ref and unions). */
function documentedFields(document: Json, schema: Json): string[] {
	if (schema.$ref)
		return documentedFields(document, document.components.schemas[schema.$ref.split('/').pop()]);
	const alternatives = schema.oneOf ?? schema.anyOf ?? [schema];
	return alternatives.flatMap((s: Json) => Object.keys(s.properties ?? {}));
}

describe('the OpenAPI document', () => {
	it('validates as OpenAPI 3.1 with @seriousme/openapi-schema-validator', async () => {
		const document = await servedDocument();
		const validator = new Validator();
		const result = await validator.validate(document);
		expect(result.errors ?? []).toEqual([]);
		expect(result.valid).toBe(true);
		expect(validator.version).toBe('3.1');
		expect(Object.keys(document.paths).length).toBeGreaterThanOrEqual(30);
	});

	it.each(ENDPOINTS.map((e) => [`${e.method.toUpperCase()} ${e.path}`, e] as const))(
		'%s answers as documented for its example',
		async (_name, endpoint) => {
			await BEFORE[endpoint.operationId]?.();
			const response = await call(endpoint);
			const body = await response.text();
			const { status = 200, mediaType, schema } = endpoint.response;
			expect(response.status, body.slice(0, 300)).toBe(status);
			if (status === 204) return expect(body).toBe('');
			if (mediaType !== '*/*') expect(response.headers.get('content-type')).toContain(mediaType);
			if (schema) {
				const answer = JSON.parse(body);
				schema.parse(answer);
				if (endpoint.tag === 'Intake') remember(answer);
			} else expect(body.length).toBeGreaterThan(0);
			if (endpoint.tag === 'Research') expect(identifyingTextsIn(body)).toEqual([]);
			for (const header of Object.keys(endpoint.headers ?? {}))
				expect(response.headers.get(header), header).toBeTruthy();
		}
	);

	it('answers every documented route with the documented error shape when signed out', async () => {
		for (const endpoint of ENDPOINTS.filter((e) => e.action)) {
			const response = await call(endpoint, anonymousClient());
			expect(response.status, endpoint.path).toBe(401);
			const body = await response.json();
			expect(body.error.code).toBe('unauthenticated');
		}
	});

	it('answers a JSON body that breaks its schema with 400 naming a field the document lists', async () => {
		const document = await servedDocument();
		const withBodies = ENDPOINTS.filter((e) => e.body);
		expect(withBodies.length).toBeGreaterThanOrEqual(10);
		for (const endpoint of withBodies) {
			const name = `${endpoint.method.toUpperCase()} ${endpoint.path}`;
			expect(document.paths[endpoint.path][endpoint.method].responses['400'], name).toBeDefined();
			const response = await call(endpoint, clientFor(endpoint), idsOf(endpoint), {});
			expect(response.status, name).toBe(400);
			const { error } = await response.json();
			const requestSchema =
				document.paths[endpoint.path][endpoint.method].requestBody.content['application/json']
					.schema;
			expect(documentedFields(document, requestSchema), name).toContain(error.field.split('.')[0]);
		}
	});

	it('answers every write it documents as frozen with 409 once the survey is submitted', async () => {
		const actor = await actorFor(DEMO_USERS.admin);
		const { asset, survey, members } = await freshSurvey(actor, ['W-01']);
		const hole = await VerificationHole.create({
			memberId: members[0].id,
			label: 'H9',
			xMm: null,
			yMm: null,
			meterReadingMm: 30,
			measuredCoverMm: 32,
			barDiameterMm: null,
			method: null
		});
		const measured = await insertMeasurements(sequelize, members[0].id);
		const { batch } = await importFile(
			actor,
			survey.id,
			'frozen.csv',
			csv(['M,X,Y,C', 'W-01,0,0,31'])
		);
		expect((await admin.postBody(`/api/v1/surveys/${survey.id}/submit`)).status).toBe(200);
		const ids = {
			assetId: asset.id,
			surveyId: survey.id,
			memberId: members[0].id,
			holeId: hole.id,
			batchId: batch.id,
			...measured
		};
		const frozenWrites = ENDPOINTS.filter((e) => e.errors?.['409']?.startsWith(FROZEN));
		expect(frozenWrites.length).toBeGreaterThanOrEqual(12);
		for (const endpoint of frozenWrites) {
			const response = await call(endpoint, admin, ids);
			const name = endpoint.operationId;
			expect(response.status, name).toBe(409);
			const { error } = await response.json();
			expect([error.code, error.message], name).toEqual([
				'conflict',
				expect.stringContaining('frozen')
			]);
		}
		expect(await VerificationHole.count({ where: { memberId: members[0].id } })).toBe(1);
		expect(await CarbonationTest.count({ where: { memberId: members[0].id } })).toBe(1);
		expect(await ChlorideProfile.count({ where: { memberId: members[0].id } })).toBe(1);
	});
});
