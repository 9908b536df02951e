/**
 * Hostile input: SQL metacharacters and 100 kB strings in every text field and filter of the
 * forms, JSON bodies and query strings. Each is answered 400 with a message, or stored exactly
 * as sent — never a 500, and the tables are all still there afterwards.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { QueryTypes, type Sequelize } from 'sequelize';
import { testSequelize } from '../helpers/database';
import { startBuiltApp } from '../helpers/server';
import { httpClient, signInAs, type HttpClient } from '../helpers/session';
import { FRESH_PASSWORD, uniqueEmail } from '../helpers/accounts';
import { MARK, SQL_META, hostileValues } from '../helpers/hostile';

type Role = 'anonymous' | 'engineer' | 'admin' | 'researcher';
interface Field {
	role: Role;
	kind: 'form' | 'json' | 'query';
	path: string;
	field: string;
	/** The other fields a valid request needs. */
	rest?: Record<string, unknown>;
	method?: 'POST' | 'PUT' | 'PATCH';
}

const POPULATIONS = '/api/v1/assets/1/populations';
const DETAIL = `${POPULATIONS}/detail`;
const DETAIL_REST = { type: 'deck', exposure: 'XD3' };

/** Every text field and filter of the app, by where it is sent. */
const FIELDS: Field[] = [
	{ role: 'anonymous', kind: 'form', path: '/sign-in', field: 'email', rest: { password: 'x' } },
	{
		role: 'anonymous',
		kind: 'form',
		path: '/sign-in',
		field: 'password',
		rest: { email: 'a@b.example' }
	},
	...['displayName', 'email', 'organisationName', 'password'].map((field): Field => ({
		role: 'anonymous',
		kind: 'form',
		path: '/sign-up',
		field,
		rest: {
			displayName: 'Hostile',
			email: 'x',
			organisationName: 'Hostile org',
			password: FRESH_PASSWORD
		}
	})),
	{ role: 'anonymous', kind: 'form', path: '/forgot-password', field: 'email' },
	{ role: 'anonymous', kind: 'form', path: '/reset-password/guess', field: 'password' },
	{
		role: 'anonymous',
		kind: 'form',
		path: '/invitations/guess?/create',
		field: 'displayName',
		rest: { password: FRESH_PASSWORD }
	},
	{
		role: 'engineer',
		kind: 'form',
		path: '/account?/password',
		field: 'currentPassword',
		rest: { newPassword: FRESH_PASSWORD }
	},
	{
		role: 'engineer',
		kind: 'form',
		path: '/account?/password',
		field: 'newPassword',
		rest: { currentPassword: 'x' }
	},
	{ role: 'engineer', kind: 'form', path: '/account/sessions?/end', field: 'handle' },
	{
		role: 'engineer',
		kind: 'form',
		path: '/account/tokens?/create',
		field: 'name',
		rest: { expiresInDays: '1' }
	},
	{
		role: 'engineer',
		kind: 'form',
		path: '/account/tokens?/create',
		field: 'expiresInDays',
		rest: { name: 'x' }
	},
	{ role: 'engineer', kind: 'form', path: '/account/tokens?/revoke', field: 'id' },
	{
		role: 'admin',
		kind: 'form',
		path: '/organisation/members?/invite',
		field: 'email',
		rest: { role: 'surveyor' }
	},
	{
		role: 'admin',
		kind: 'form',
		path: '/organisation/members?/invite',
		field: 'role',
		rest: { email: 'x@tests.example' }
	},
	{
		role: 'admin',
		kind: 'form',
		path: '/organisation/members?/role',
		field: 'role',
		rest: { id: '2' }
	},
	{ role: 'admin', kind: 'form', path: '/organisation/members?/remove', field: 'id' },
	{ role: 'admin', kind: 'form', path: '/switch-organisation', field: 'organisationId' },
	{ role: 'engineer', kind: 'form', path: '/assets/3/assessments?/save', field: 'title' },
	{
		role: 'engineer',
		kind: 'form',
		path: '/assets/3/assessments?/save',
		field: 'recommendations',
		rest: { title: `${MARK} form` }
	},
	{
		role: 'engineer',
		kind: 'form',
		path: '/portfolio/1?/share',
		field: 'email',
		rest: { assessment: '1' }
	},
	{
		role: 'engineer',
		kind: 'form',
		path: '/portfolio/1?/share',
		field: 'assessment',
		rest: { email: 'x@tests.example' }
	},
	{ role: 'engineer', kind: 'json', path: '/api/v1/tokens', field: 'name' },
	{ role: 'engineer', kind: 'json', path: '/api/v1/assets/3/assessments', field: 'title' },
	{
		role: 'engineer',
		kind: 'json',
		path: '/api/v1/assets/3/assessments',
		field: 'recommendations',
		rest: { title: `${MARK} json` }
	},
	{
		role: 'engineer',
		kind: 'json',
		path: '/api/v1/assets/3/assessments',
		field: 'split',
		rest: { title: `${MARK} split` }
	},
	{
		role: 'engineer',
		kind: 'json',
		path: '/api/v1/me/organisation',
		field: 'organisationId',
		method: 'PUT'
	},
	{
		role: 'admin',
		kind: 'json',
		path: '/api/v1/organisation/members/2',
		field: 'role',
		method: 'PATCH'
	},
	...['survey', 'split', 'fractile', 'confidence', 'percentile', 'model', 'method', 'rules'].map(
		(field): Field => ({ role: 'engineer', kind: 'query', path: POPULATIONS, field })
	),
	...['type', 'exposure', 'face', 'survey'].map((field): Field => ({
		role: 'engineer',
		kind: 'query',
		path: DETAIL,
		field,
		rest: DETAIL_REST
	})),
	{ role: 'engineer', kind: 'query', path: '/assets/1/populations', field: 'split' },
	{ role: 'engineer', kind: 'query', path: '/assets/1/populations/detail', field: 'type' },
	{ role: 'anonymous', kind: 'query', path: '/sign-in', field: 'next' },
	// Research filters: the same list fields on statistics, readings and the exports.
	...[
		'/api/v1/research/statistics',
		'/api/v1/research/readings',
		'/api/v1/research/members',
		'/api/v1/research/exports/groups.csv',
		'/research'
	].flatMap((path) =>
		[
			'memberType',
			'exposureClass',
			'face',
			'designCode',
			'decade',
			'cNomMm',
			'groupBy',
			'cursor',
			'limit'
		].map((field): Field => ({ role: 'researcher', kind: 'query', path, field }))
	),
	{
		role: 'admin',
		kind: 'json',
		path: '/api/v1/assets/1/research-consent',
		field: 'researchOptIn',
		method: 'PUT'
	}
];

let sequelize: Sequelize;
let throttled: Awaited<ReturnType<typeof startBuiltApp>>;
const clients = {} as Record<Role, HttpClient>;

beforeAll(async () => {
	sequelize = testSequelize();
	// Anonymous forms go to a copy of the app that trusts X-Forwarded-For, from an address of
	// their own, so the failed sign-ins here never count against the shared app's 127.0.0.1.
	throttled = await startBuiltApp({ ADDRESS_HEADER: 'x-forwarded-for', XFF_DEPTH: '1' });
	clients.anonymous = httpClient(
		{ 'x-forwarded-for': `10.250.${Date.now() % 250}.7` },
		'',
		throttled.origin
	);
	clients.engineer = await signInAs('engineer');
	clients.admin = await signInAs('admin');
	clients.researcher = await signInAs('researcher');
});

afterAll(async () => {
	await throttled?.stop();
	// What this file stored on purpose is removed again, so the demo data stays as it was.
	await sequelize.query(
		`DELETE FROM assessment_risks WHERE assessment_id IN (SELECT id FROM assessments WHERE title LIKE ?)`,
		{ replacements: [`${MARK}%`] }
	);
	await sequelize.query('DELETE FROM assessments WHERE title LIKE ?', {
		replacements: [`${MARK}%`]
	});
	await sequelize.query('DELETE FROM api_tokens WHERE name LIKE ?', {
		replacements: [`%${SQL_META}%`]
	});
	await sequelize.close();
});

function request(f: Field, value: string): Promise<Response> {
	const client = clients[f.role];
	const fields = { ...f.rest, [f.field]: value };
	if (f.kind === 'form') return client.postForm(f.path, fields as Record<string, string>);
	if (f.kind === 'query') {
		const url = new URL(f.path, 'http://x');
		for (const [k, v] of Object.entries(fields)) url.searchParams.set(k, String(v));
		return client.get(url.pathname + url.search);
	}
	if (f.method === 'PUT') return client.putJson(f.path, fields);
	if (f.method === 'PATCH') return client.patchJson(f.path, fields);
	return client.postJson(f.path, fields);
}

/** Answered on purpose: no 5xx, and a refusal carries a message (a field for the API). */
async function expectHandled(response: Response, label: string) {
	const text = await response.text();
	expect(response.status, `${label}: ${text.slice(0, 200)}`).toBeLessThan(500);
	expect(text, label).not.toContain('Something went wrong on our side');
	if (response.status === 400 && response.headers.get('content-type')?.includes('json')) {
		const body = JSON.parse(text) as { error?: { message?: string } };
		expect(body.error?.message, label).toBeTruthy();
	}
}

describe('SQL metacharacters and very long strings', () => {
	it.each(FIELDS.map((f) => [`${f.kind} ${f.path} ${f.field}`, f] as const))(
		'%s',
		async (label, f) => {
			for (const [name, value] of Object.entries(hostileValues())) {
				await expectHandled(await request(f, value), `${label} (${name})`);
			}
		}
	);

	it('stores metacharacters verbatim where they are allowed (a title, a token name)', async () => {
		const title = `${MARK} ${SQL_META}`;
		const saved = await clients.engineer.postJson('/api/v1/assets/3/assessments', { title });
		expect(saved.status).toBe(201);
		const id = (await saved.json()).assessment.id;
		const read = await (await clients.engineer.get(`/api/v1/assessments/${id}`)).json();
		expect(JSON.stringify(read)).toContain(JSON.stringify(title).slice(1, -1));
		const name = SQL_META.slice(0, 70);
		expect(
			(await clients.engineer.postJson('/api/v1/tokens', { name, expiresInDays: 1 })).status
		).toBe(201);
		const tokens = (await (await clients.engineer.get('/api/v1/tokens')).json()).tokens as {
			name: string;
		}[];
		expect(tokens.map((t) => t.name)).toContain(name);
	});

	it('leaves every table in place and the demo users intact', async () => {
		const [{ n }] = await sequelize.query<{ n: number }>('SELECT COUNT(*) AS n FROM users', {
			type: QueryTypes.SELECT
		});
		expect(Number(n)).toBeGreaterThanOrEqual(5);
		const readings = await sequelize.query<{ n: number }>('SELECT COUNT(*) AS n FROM readings', {
			type: QueryTypes.SELECT
		});
		expect(Number(readings[0].n)).toBeGreaterThan(0);
		expect((await throttled.output()).includes('Error')).toBe(false);
	});
});

describe('sign-up with metacharacters in the names', () => {
	it('stores the display and organisation names exactly as typed', async () => {
		const email = uniqueEmail('meta');
		const displayName = `O'Brien"; DROP TABLE users; --`;
		const response = await clients.anonymous.postForm('/sign-up', {
			displayName,
			email,
			organisationName: `Bobby ${SQL_META.slice(0, 60)}`,
			password: FRESH_PASSWORD
		});
		expect(response.status).toBe(303);
		const row = await sequelize.query<{ displayName: string }>(
			'SELECT display_name AS displayName FROM users WHERE email = ?',
			{
				replacements: [email],
				type: QueryTypes.SELECT,
				plain: true
			}
		);
		expect(row?.displayName).toBe(displayName);
	});
});
