/**
 * The edit pages of assets, surveys, members and verification holes, posted as a browser posts
 * them (over HTTP, the built app, the real database): a change saved and logged, a bad field
 * answered with its message and nothing changed, a frozen survey's records refused, another
 * organisation's records 404.
 */
import type { Model, Sequelize } from 'sequelize';
import type { z } from 'zod';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
	assetSchema,
	holeSchema,
	memberSchema,
	surveySchema
} from '../../../src/lib/intake/schemas';
import { SAVED_NOTICES, type SavedWhat } from '../../../src/lib/intake/savedNotice';
import { formValuesOf } from '../../../src/lib/intake/formValues';
import { actorFor, testSequelize } from '../../helpers/intake';
import {
	auditOf,
	editableRecords,
	foreignRecords,
	submitSurvey,
	type EditableRecords
} from '../../helpers/editing';
import { DEMO_USERS, signInAs, type HttpClient } from '../../helpers/session';

interface Kind {
	role: 'engineer' | 'surveyor';
	record: (r: EditableRecords) => Model;
	schema: z.ZodObject;
	page: (r: EditableRecords) => string;
	/** Where a save sends the browser. */
	after: (r: EditableRecords) => string;
	/** The audit subject: holes are logged against their member. */
	subject: (r: EditableRecords) => [string, number];
	change: { field: string; typed: string; stored: unknown };
	bad: { field: string; typed: string; message: string };
}

const KINDS: Record<'asset' | 'survey' | 'member' | 'hole', Kind> = {
	asset: {
		role: 'engineer',
		record: (r) => r.asset,
		schema: assetSchema,
		page: (r) => `/assets/${r.asset.id}/edit`,
		after: (r) => `/assets/${r.asset.id}?saved=asset`,
		subject: (r) => ['asset', r.asset.id],
		change: { field: 'designServiceLifeYears', typed: '100', stored: 100 },
		bad: {
			field: 'yearOfConstruction',
			typed: '1750',
			message: 'Year of construction must be at least 1800.'
		}
	},
	survey: {
		role: 'surveyor',
		record: (r) => r.survey,
		schema: surveySchema,
		page: (r) => `/surveys/${r.survey.id}/edit`,
		after: (r) => `/surveys/${r.survey.id}?saved=survey`,
		subject: (r) => ['survey', r.survey.id],
		change: {
			field: 'title',
			typed: 'Deck soffits, second visit',
			stored: 'Deck soffits, second visit'
		},
		bad: {
			field: 'surveyDate',
			typed: '2026-13-40',
			message: 'Give the survey date as YYYY-MM-DD.'
		}
	},
	member: {
		role: 'surveyor',
		record: (r) => r.member,
		schema: memberSchema,
		page: (r) => `/members/${r.member.id}/edit`,
		after: (r) => `/members/${r.member.id}/entry?saved=member`,
		subject: (r) => ['member', r.member.id],
		// Lowered: 22.5 + Δc_dev 10 stays within c_nom 35 mm (EN 1992-1-1 (4.1)); 32.5 would not.
		change: { field: 'cMinMm', typed: '22,5', stored: 22.5 },
		bad: { field: 'cNomMm', typed: 'forty', message: 'c_nom is required and must be a number.' }
	},
	hole: {
		role: 'surveyor',
		record: (r) => r.hole,
		schema: holeSchema,
		page: (r) => `/holes/${r.hole.id}/edit`,
		after: (r) => `/members/${r.member.id}/entry?saved=hole`,
		subject: (r) => ['member', r.member.id],
		change: { field: 'measuredCoverMm', typed: '34.5', stored: 34.5 },
		bad: { field: 'meterReadingMm', typed: '-3', message: 'Meter reading must be at least 0.' }
	}
};

let sequelize: Sequelize;
const clients = {} as Record<Kind['role'], HttpClient>;
let records: () => Promise<EditableRecords>;

beforeAll(async () => {
	sequelize = testSequelize();
	clients.engineer = await signInAs('engineer');
	clients.surveyor = await signInAs('surveyor');
	const actor = await actorFor(DEMO_USERS.surveyor);
	records = () => editableRecords(actor);
});
afterAll(async () => {
	await sequelize.close();
});

/** The record as its form shows it, with `fields` typed over it, posted to the save action. */
function save(kind: Kind, r: EditableRecords, fields: Record<string, string> = {}) {
	const values = formValuesOf(kind.record(r).get({ plain: true }), kind.schema);
	return clients[kind.role].postForm(`${kind.page(r)}?/save`, { ...values, ...fields });
}

const stored = async (kind: Kind, r: EditableRecords, field: string) =>
	(await kind.record(r).reload()).get(field);

describe.each(Object.entries(KINDS))('editing a %s through its page', (name, kind) => {
	it('shows the saved values, saves a change (303) and logs it, old and new', async () => {
		const r = await records();
		const { field, typed } = kind.change;
		const before = await stored(kind, r, field);
		const page = await clients[kind.role].get(kind.page(r));
		expect(page.status).toBe(200);
		expect(await page.text()).toMatch(new RegExp(`name="${field}"[^>]* value="${before}"`));
		const saved = await save(kind, r, { [field]: typed });
		expect(saved.status).toBe(303);
		expect(saved.headers.get('location')).toBe(kind.after(r));
		// The page it returns to says so, in the words kept for that record (savedNotice.ts).
		const shown = await (await clients[kind.role].get(kind.after(r))).text();
		expect(shown).toContain(SAVED_NOTICES[name as SavedWhat]);
		expect(await stored(kind, r, field)).toBe(kind.change.stored);
		const [type, id] = kind.subject(r);
		const events = await auditOf(`${name}.updated`, type, id);
		expect(events).toHaveLength(1);
		expect((events[0].detail as { changes: unknown }).changes).toEqual({
			[field]: { from: before, to: kind.change.stored }
		});
		// Saving the untouched form again changes nothing and logs nothing.
		expect((await save(kind, r)).status).toBe(303);
		expect(await auditOf(`${name}.updated`, type, id)).toHaveLength(1);
	});

	it('answers a bad field 400 with its message and the typed value, and changes nothing', async () => {
		const r = await records();
		const { field, typed, message } = kind.bad;
		const before = await stored(kind, r, field);
		const response = await save(kind, r, {
			[field]: typed,
			[kind.change.field]: kind.change.typed
		});
		expect(response.status).toBe(400);
		const html = await response.text();
		expect(html).toContain(message);
		expect(html).toContain(`value="${typed}"`);
		expect(await stored(kind, r, field)).toEqual(before);
		expect(await stored(kind, r, kind.change.field)).not.toEqual(kind.change.stored);
		expect(await auditOf(`${name}.updated`, ...kind.subject(r))).toEqual([]);
	});

	it("answers another organisation's record 404, page and save, and changes nothing", async () => {
		const theirs = await foreignRecords();
		expect((await clients[kind.role].get(kind.page(theirs))).status).toBe(404);
		const before = await stored(kind, theirs, kind.change.field);
		const saved = await save(kind, theirs, { [kind.change.field]: kind.change.typed });
		expect(saved.status).toBe(404);
		expect(await stored(kind, theirs, kind.change.field)).toEqual(before);
	});
});

// An asset belongs to no survey, so only the others freeze.
describe.each(['survey', 'member', 'hole'] as const)('a submitted survey’s %s', (name) => {
	const kind = KINDS[name];
	it('is shown read-only with the reason, and a save is refused (409) and changes nothing', async () => {
		const r = await records();
		await submitSurvey(clients.surveyor, r.survey.id);
		const reason = 'The survey is submitted: its readings are frozen.';
		const page = await (await clients[kind.role].get(kind.page(r))).text();
		expect(page).toContain(reason);
		expect(page).toMatch(/<fieldset[^>]* disabled/);
		const before = await stored(kind, r, kind.change.field);
		const saved = await save(kind, r, { [kind.change.field]: kind.change.typed });
		expect(saved.status).toBe(409);
		expect(await saved.text()).toContain(reason);
		expect(await stored(kind, r, kind.change.field)).toEqual(before);
		expect(await auditOf(`${name}.updated`, ...kind.subject(r))).toEqual([]);
	});
});

describe('the policy', () => {
	it('refuses a surveyor the asset edit and an owner the member edit (403), changing nothing', async () => {
		const r = await records();
		const asset = await save({ ...KINDS.asset, role: 'surveyor' }, r, { name: 'Renamed' });
		expect(asset.status).toBe(403);
		expect((await clients.surveyor.get(KINDS.asset.page(r))).status).toBe(403);
		const owner = await signInAs('owner');
		expect((await owner.get(KINDS.member.page(r))).status).toBe(403);
		expect((await owner.postForm(`${KINDS.member.page(r)}?/save`, {})).status).toBe(403);
		expect(await stored(KINDS.asset, r, 'name')).not.toBe('Renamed');
	});
});
