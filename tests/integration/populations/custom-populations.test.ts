import { randomBytes } from 'node:crypto';
import { QueryTypes, type Sequelize } from 'sequelize';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { PopulationOverview } from '../../../src/lib/server/populations';
import { testSequelize } from '../../helpers/database';
import { CAR_PARK, assetIdByName } from '../../helpers/actors';
import { signUpNewOrganisation } from '../../helpers/accounts';
import { anonymousClient, signInAs, type HttpClient } from '../../helpers/session';

const JSON_ACCEPT = { accept: 'application/json' };

/** A name no earlier run used: the names are unique per asset and the test database persists. */
const uniqueName = (label: string) => `${label} ${randomBytes(3).toString('hex')}`;

interface MemberRow {
	id: number;
	memberType: string;
	exposureClass: string;
}

/**
 * Populations the engineer makes from chosen members, over HTTP against the built app, with the
 * database read directly (not through the service) to check what was written and counted.
 */
describe('custom populations over HTTP', () => {
	let sequelize: Sequelize;
	let carParkId: number;
	let engineer: HttpClient;
	/** Members of the car park in approved surveys (the default selection), grouped by key. */
	let groups: Map<string, MemberRow[]>;
	const customUrl = () => `/api/v1/assets/${carParkId}/populations/custom`;

	const count = async (sql: string, replacements: unknown[]) =>
		Number(
			(await sequelize.query<{ n: number }>(sql, {
				replacements,
				type: QueryTypes.SELECT,
				plain: true
			}))!.n
		);
	const auditRows = (id: number) =>
		count(
			`SELECT COUNT(*) AS n FROM audit_events
			  WHERE action = 'population.custom.create' AND subject_type = 'custom_population'
			    AND subject_id = ?`,
			[String(id)]
		);
	const populationsNamed = (name: string) =>
		count('SELECT COUNT(*) AS n FROM custom_populations WHERE asset_id = ? AND name = ?', [
			carParkId,
			name
		]);
	const readingsOf = (memberIds: number[]) =>
		count(
			`SELECT COUNT(*) AS n FROM readings WHERE member_id IN (${memberIds.map(() => '?').join(',')})`,
			memberIds
		);
	/** The split the tests share: the first two members of the largest group, split out of it. */
	const split = () => {
		const [key, members] = [...groups].sort((a, b) => b[1].length - a[1].length)[0];
		return { key, members, chosen: members.slice(0, 2).map((m) => m.id) };
	};

	beforeAll(async () => {
		sequelize = testSequelize();
		carParkId = await assetIdByName(sequelize, CAR_PARK);
		await anonymousClient().get('/api/health');
		engineer = await signInAs('engineer');
		const rows = await sequelize.query<MemberRow>(
			`SELECT m.id, m.member_type AS memberType, m.exposure_class AS exposureClass
			   FROM members m JOIN surveys s ON s.id = m.survey_id
			  WHERE m.asset_id = ? AND s.status = 'approved'
			    AND EXISTS (SELECT 1 FROM readings r WHERE r.member_id = m.id)
			  ORDER BY m.id`,
			{ replacements: [carParkId], type: QueryTypes.SELECT }
		);
		groups = new Map();
		for (const row of rows) {
			const key = `${row.memberType}|${row.exposureClass}`;
			groups.set(key, [...(groups.get(key) ?? []), row]);
		}
		expect(groups.size, 'the demo car park has more than one group').toBeGreaterThan(1);
		expect(split().members.length, 'a group with members left after a split').toBeGreaterThan(2);
	});
	afterAll(async () => {
		await sequelize.close();
	});

	it('saves a split as the engineer: 201, the row, and exactly one audit row', async () => {
		const { key, chosen } = split();
		const name = uniqueName('Low bay');
		const response = await engineer.postJson(customUrl(), {
			name,
			members: chosen,
			splitFrom: key
		});
		expect(response.status).toBe(201);
		const { population } = await response.json();
		expect(population.name).toBe(name);
		expect(population.memberIds).toEqual([...chosen].sort((a, b) => a - b));
		expect(population.splitFrom).toBe(key);
		expect(await populationsNamed(name)).toBe(1);
		expect(await auditRows(population.id)).toBe(1);
		const listed = await (await engineer.get(customUrl(), JSON_ACCEPT)).json();
		expect(listed.populations.map((p: { id: number }) => p.id)).toContain(population.id);
	});

	it('refuses a second population of the same name on the asset, naming the field, writing nothing', async () => {
		const { chosen } = split();
		const name = uniqueName('Twice');
		expect((await engineer.postJson(customUrl(), { name, members: chosen })).status).toBe(201);
		const audits = await count(
			"SELECT COUNT(*) AS n FROM audit_events WHERE action = 'population.custom.create'",
			[]
		);
		const again = await engineer.postJson(customUrl(), { name, members: chosen.slice(0, 1) });
		expect(again.status).toBe(400);
		const body = await again.json();
		expect(body.error.field).toBe('name');
		expect(body.error.message).toContain(name);
		expect(await populationsNamed(name)).toBe(1);
		expect(
			await count(
				"SELECT COUNT(*) AS n FROM audit_events WHERE action = 'population.custom.create'",
				[]
			)
		).toBe(audits);
	});

	it('lets only one of two simultaneous saves of the same name win', async () => {
		const { chosen } = split();
		const name = uniqueName('Race');
		const answers = await Promise.all(
			[0, 1].map(() => engineer.postJson(customUrl(), { name, members: chosen }))
		);
		expect(answers.map((a) => a.status).sort()).toEqual([201, 400]);
		const loser = await answers.find((a) => a.status === 400)!.json();
		expect(loser.error.field).toBe('name');
		expect(await populationsNamed(name)).toBe(1);
	});

	it('refuses a member of another asset, naming the field', async () => {
		const foreign = await sequelize.query<{ id: number }>(
			'SELECT id FROM members WHERE asset_id <> ? ORDER BY id LIMIT 1',
			{ replacements: [carParkId], type: QueryTypes.SELECT, plain: true }
		);
		expect(foreign, 'the demo has members of another asset').toBeTruthy();
		const name = uniqueName('Elsewhere');
		const response = await engineer.postJson(customUrl(), {
			name,
			members: [split().chosen[0], foreign!.id]
		});
		expect(response.status).toBe(400);
		const body = await response.json();
		expect(body.error.field).toBe('members');
		expect(body.error.message).toContain(String(foreign!.id));
		expect(await populationsNamed(name)).toBe(0);
	});

	it('refuses, for a split, a member of another group of the same asset, naming the field', async () => {
		const { key, chosen } = split();
		const other = [...groups].find(([k]) => k !== key)![1][0];
		const name = uniqueName('Mixed split');
		const response = await engineer.postJson(customUrl(), {
			name,
			members: [chosen[0], other.id],
			splitFrom: key
		});
		expect(response.status).toBe(400);
		const body = await response.json();
		expect(body.error.field).toBe('members');
		expect(body.error.message).toContain(String(other.id));
		expect(await populationsNamed(name)).toBe(0);
	});

	it('refuses a split that takes every member of the group, naming the field', async () => {
		// The page's split form allows this neither: a split must leave a rest to judge beside it.
		const { key } = split();
		const [memberType, exposureClass] = key.split('|');
		const every = await sequelize.query<{ id: number }>(
			'SELECT id FROM members WHERE asset_id = ? AND member_type = ? AND exposure_class = ?',
			{ replacements: [carParkId, memberType, exposureClass], type: QueryTypes.SELECT }
		);
		const name = uniqueName('Everything');
		const response = await engineer.postJson(customUrl(), {
			name,
			members: every.map((m) => m.id),
			splitFrom: key
		});
		expect(response.status).toBe(400);
		const body = await response.json();
		expect(body.error.field).toBe('members');
		expect(await populationsNamed(name)).toBe(0);
	});

	it('refuses an empty member list, naming the field', async () => {
		const name = uniqueName('Nobody');
		const response = await engineer.postJson(customUrl(), { name, members: [] });
		expect(response.status).toBe(400);
		const body = await response.json();
		expect(body.error.field).toBe('members');
		expect(body.error.message).toBe('Choose at least one member.');
		expect(await populationsNamed(name)).toBe(0);
	});

	// docs/roles.md and src/lib/server/policy.ts: saving a population is `assessment:write`,
	// which the owner, the surveyor and the researcher do not hold.
	it.each(['owner', 'surveyor', 'researcher'] as const)(
		'refuses the %s, who may not write assessments: 403, nothing written',
		async (role) => {
			const client = await signInAs(role);
			const name = uniqueName(`By ${role}`);
			const response = await client.postJson(customUrl(), { name, members: split().chosen });
			expect(response.status).toBe(403);
			expect((await response.json()).error.code).toBe('forbidden');
			expect(await populationsNamed(name)).toBe(0);
		}
	);

	it('judges exactly the chosen members, and the rest of the group, on the detail API', async () => {
		const { key, members, chosen } = split();
		const created = await engineer.postJson(customUrl(), {
			name: uniqueName('Judged'),
			members: chosen,
			splitFrom: key
		});
		expect(created.status).toBe(201);
		const { population } = await created.json();
		const rest = members.map((m) => m.id).filter((id) => !chosen.includes(id));
		const detailUrl = `/api/v1/assets/${carParkId}/populations/detail?custom=${population.id}`;

		const chosenDetail = await engineer.get(detailUrl, JSON_ACCEPT);
		expect(chosenDetail.status).toBe(200);
		const chosenBody = await chosenDetail.json();
		expect(chosenBody.boxes.map((b: { memberId: number }) => b.memberId).sort()).toEqual(
			[...chosen].sort()
		);
		const chosenN = chosenBody.population.assessment.description.n;
		expect(chosenN).toBe(await readingsOf(chosen));

		const restDetail = await engineer.get(`${detailUrl}&part=rest`, JSON_ACCEPT);
		expect(restDetail.status).toBe(200);
		const restBody = await restDetail.json();
		expect(restBody.boxes.map((b: { memberId: number }) => b.memberId).sort()).toEqual(
			[...rest].sort()
		);
		const restN = restBody.population.assessment.description.n;
		expect(restN).toBe(await readingsOf(rest));

		// The source group as the overview judges it: the two parts add up to it.
		const overview = (await (
			await engineer.get(`/api/v1/assets/${carParkId}/populations`, JSON_ACCEPT)
		).json()) as PopulationOverview;
		const [memberType, exposureClass] = key.split('|');
		const source = overview.populations.find(
			(p) => p.key.memberType === memberType && p.key.exposureClass === exposureClass
		);
		expect(chosenN + restN).toBe(source!.assessment!.description.n);
	});

	it('answers a population id of another asset, or none, with 404 on the detail API', async () => {
		const created = await engineer.postJson(customUrl(), {
			name: uniqueName('Kept here'),
			members: split().chosen
		});
		const { population } = await created.json();
		const otherAsset = await sequelize.query<{ id: number }>(
			`SELECT a.id FROM assets a JOIN assets c ON c.organisation_id = a.organisation_id
			  WHERE c.id = ? AND a.id <> c.id ORDER BY a.id LIMIT 1`,
			{ replacements: [carParkId], type: QueryTypes.SELECT, plain: true }
		);
		expect(otherAsset, 'the demo consultancy has a second asset').toBeTruthy();
		const elsewhere = await engineer.get(
			`/api/v1/assets/${otherAsset!.id}/populations/detail?custom=${population.id}`,
			JSON_ACCEPT
		);
		expect(elsewhere.status).toBe(404);
		const none = await engineer.get(
			`/api/v1/assets/${carParkId}/populations/detail?custom=4000000000`,
			JSON_ACCEPT
		);
		expect(none.status).toBe(404);
		// A population that is not a split has no rest to judge.
		const noRest = await engineer.get(
			`/api/v1/assets/${carParkId}/populations/detail?custom=${population.id}&part=rest`,
			JSON_ACCEPT
		);
		expect(noRest.status).toBe(404);
	});

	it('answers another organisation’s asset with the 404 of a missing one', async () => {
		const stranger = await signUpNewOrganisation('custom-stranger');
		const missing = 4_000_000_000;
		const body = { name: uniqueName('Not theirs'), members: split().chosen };
		const foreignPost = await stranger.client.postJson(customUrl(), body);
		const missingPost = await stranger.client.postJson(
			`/api/v1/assets/${missing}/populations/custom`,
			body
		);
		expect(foreignPost.status).toBe(404);
		expect(missingPost.status).toBe(404);
		const foreignError = (await foreignPost.json()).error;
		const missingError = (await missingPost.json()).error;
		expect(foreignError.code).toBe(missingError.code);
		expect(foreignError.message).toBe(missingError.message);
		const foreignGet = await stranger.client.get(customUrl(), JSON_ACCEPT);
		const missingGet = await stranger.client.get(
			`/api/v1/assets/${missing}/populations/custom`,
			JSON_ACCEPT
		);
		expect(foreignGet.status).toBe(404);
		expect(missingGet.status).toBe(404);
		expect((await foreignGet.json()).error.message).toBe((await missingGet.json()).error.message);
		expect(await populationsNamed(body.name)).toBe(0);
	});

	it('lets an organisation the asset is shared with read its populations but not make one', async () => {
		const { key, chosen } = split();
		const created = await engineer.postJson(customUrl(), {
			name: uniqueName('Shared view'),
			members: chosen,
			splitFrom: key
		});
		const { population } = await created.json();
		// The admin of a new organisation holds every right, so only the share can stop the write.
		const reader = await signUpNewOrganisation('custom-reader');
		const organisationId = await count(
			'SELECT active_organisation_id AS n FROM users WHERE email = ?',
			[reader.email]
		);
		await sequelize.query(
			'INSERT INTO asset_shares (asset_id, organisation_id, created_at) VALUES (?, ?, NOW())',
			{ replacements: [carParkId, organisationId] }
		);
		const list = await reader.client.get(customUrl(), JSON_ACCEPT);
		expect(list.status).toBe(200);
		expect((await list.json()).populations.map((p: { id: number }) => p.id)).toContain(
			population.id
		);
		const detail = await reader.client.get(
			`/api/v1/assets/${carParkId}/populations/detail?custom=${population.id}&part=rest`,
			JSON_ACCEPT
		);
		expect(detail.status).toBe(200);
		const name = uniqueName('Reader made');
		const refused = await reader.client.postJson(customUrl(), { name, members: chosen });
		expect(refused.status).toBe(403);
		expect((await refused.json()).error.code).toBe('read_only');
		expect(await populationsNamed(name)).toBe(0);
		// Nor rename or delete one: the share is for reading.
		const renamed = await reader.client.patchJson(`${customUrl()}/${population.id}`, {
			name: uniqueName('Reader renamed')
		});
		expect(renamed.status).toBe(403);
		expect((await renamed.json()).error.code).toBe('read_only');
		const deleted = await reader.client.delete(`${customUrl()}/${population.id}`);
		expect(deleted.status).toBe(403);
		expect((await deleted.json()).error.code).toBe('read_only');
		expect(await populationsNamed(population.name)).toBe(1);
	});

	const made = async (label: string) => {
		const response = await engineer.postJson(customUrl(), {
			name: uniqueName(label),
			members: split().chosen
		});
		expect(response.status).toBe(201);
		return (await response.json()).population as { id: number; name: string };
	};
	const parsed = (detail: unknown) =>
		typeof detail === 'string' ? JSON.parse(detail) : (detail as Record<string, unknown>);
	const auditOf = (action: string, id: number) =>
		sequelize.query<{ detail: unknown }>(
			`SELECT detail FROM audit_events WHERE action = ? AND subject_type = 'custom_population'
			   AND subject_id = ? ORDER BY id`,
			{ replacements: [action, String(id)], type: QueryTypes.SELECT }
		);

	it('renames a population as the engineer: 200, the row, one audit row with both names', async () => {
		const population = await made('To rename');
		const name = uniqueName('Renamed');
		const response = await engineer.patchJson(`${customUrl()}/${population.id}`, { name });
		expect(response.status).toBe(200);
		expect((await response.json()).population).toMatchObject({ id: population.id, name });
		expect(await populationsNamed(name)).toBe(1);
		expect(await populationsNamed(population.name)).toBe(0);
		const audits = await auditOf('population.custom.rename', population.id);
		expect(audits).toHaveLength(1);
		const detail = parsed(audits[0].detail);
		expect(detail).toMatchObject({ from: population.name, to: name });
	});

	it('refuses a rename to a name the asset already has, naming the field, changing nothing', async () => {
		const [first, second] = [await made('Kept name'), await made('Other name')];
		const response = await engineer.patchJson(`${customUrl()}/${second.id}`, {
			name: first.name
		});
		expect(response.status).toBe(400);
		const body = await response.json();
		expect(body.error.field).toBe('name');
		expect(body.error.message).toContain(first.name);
		expect(await populationsNamed(second.name)).toBe(1);
		expect(await auditOf('population.custom.rename', second.id)).toHaveLength(0);
		const empty = await engineer.patchJson(`${customUrl()}/${second.id}`, { name: '  ' });
		expect(empty.status).toBe(400);
		expect((await empty.json()).error.field).toBe('name');
	});

	it('lets only one of two simultaneous renames to the same name win', async () => {
		const [a, b] = [await made('Race A'), await made('Race B')];
		const name = uniqueName('Raced');
		const answers = await Promise.all(
			[a, b].map((p) => engineer.patchJson(`${customUrl()}/${p.id}`, { name }))
		);
		expect(answers.map((r) => r.status).sort()).toEqual([200, 400]);
		const loser = await answers.find((r) => r.status === 400)!.json();
		expect(loser.error.field).toBe('name');
		expect(await populationsNamed(name)).toBe(1);
	});

	it('deletes a population that an assessment carries; the assessment keeps its own copy', async () => {
		const population = await made('To delete');
		const saved = await engineer.postJson(`/api/v1/assets/${carParkId}/assessments`, {
			title: uniqueName('Carries a custom population'),
			custom: [population.id]
		});
		expect(saved.status).toBe(201);
		const assessmentId = (await saved.json()).assessment.id as number;
		const read = async () =>
			(await (await engineer.get(`/api/v1/assessments/${assessmentId}`, JSON_ACCEPT)).json())
				.assessment;
		const before = await read();
		const carried = before.snapshot.custom.find(
			(c: { custom: { id: number } }) => c.custom.id === population.id
		);
		expect(carried.custom.name).toBe(population.name);

		const response = await engineer.delete(`${customUrl()}/${population.id}`);
		expect(response.status).toBe(204);
		expect(await populationsNamed(population.name)).toBe(0);
		const audits = await auditOf('population.custom.delete', population.id);
		expect(audits).toHaveLength(1);
		expect(parsed(audits[0].detail)).toMatchObject({
			name: population.name,
			memberIds: [...split().chosen].sort((x, y) => x - y)
		});
		// The snapshot is self-contained: the same text (its sha256) and the same copy.
		const after = await read();
		expect(after.snapshotSha256).toBe(before.snapshotSha256);
		expect(after.snapshot.custom).toEqual(before.snapshot.custom);
		// The population is gone from the list and its detail, and a second delete finds nothing.
		const listed = await (await engineer.get(customUrl(), JSON_ACCEPT)).json();
		expect(listed.populations.map((p: { id: number }) => p.id)).not.toContain(population.id);
		const detail = await engineer.get(
			`/api/v1/assets/${carParkId}/populations/detail?custom=${population.id}`,
			JSON_ACCEPT
		);
		expect(detail.status).toBe(404);
		expect((await engineer.delete(`${customUrl()}/${population.id}`)).status).toBe(404);
		await sequelize.query('DELETE FROM assessment_risks WHERE assessment_id = ?', {
			replacements: [assessmentId]
		});
		await sequelize.query('DELETE FROM assessments WHERE id = ?', { replacements: [assessmentId] });
	});

	it('saves an assessment carrying only the custom populations chosen: some, none, or by default all', async () => {
		const [a, b] = [await made('Carried'), await made('Left out')];
		const every = (
			(await (await engineer.get(customUrl(), JSON_ACCEPT)).json()).populations as {
				id: number;
			}[]
		).map((p) => p.id);
		const saved: number[] = [];
		const carried = async (custom: number[] | undefined) => {
			const response = await engineer.postJson(`/api/v1/assets/${carParkId}/assessments`, {
				title: uniqueName('Chosen populations'),
				...(custom === undefined ? {} : { custom })
			});
			expect(response.status).toBe(201);
			const id = (await response.json()).assessment.id as number;
			saved.push(id);
			const body = await (await engineer.get(`/api/v1/assessments/${id}`, JSON_ACCEPT)).json();
			return (body.assessment.snapshot.custom as { custom: { id: number } }[]).map(
				(c) => c.custom.id
			);
		};
		try {
			expect(await carried([a.id])).toEqual([a.id]);
			expect(await carried([])).toEqual([]);
			const all = await carried(undefined);
			expect(all).toEqual(expect.arrayContaining([a.id, b.id, ...every]));
			expect(all).toHaveLength(every.length);
			// One that is not this asset's: 400 naming the field, nothing saved.
			const before = await count('SELECT COUNT(*) AS n FROM assessments WHERE asset_id = ?', [
				carParkId
			]);
			const refused = await engineer.postJson(`/api/v1/assets/${carParkId}/assessments`, {
				title: uniqueName('Unknown population'),
				custom: [a.id, 4_000_000_000]
			});
			expect(refused.status).toBe(400);
			const error = (await refused.json()).error;
			expect(error.field).toBe('custom');
			expect(error.message).toContain('4000000000');
			expect(
				await count('SELECT COUNT(*) AS n FROM assessments WHERE asset_id = ?', [carParkId])
			).toBe(before);
		} finally {
			for (const id of saved) {
				await sequelize.query('DELETE FROM assessment_risks WHERE assessment_id = ?', {
					replacements: [id]
				});
				await sequelize.query('DELETE FROM assessments WHERE id = ?', { replacements: [id] });
			}
		}
	});

	it('answers a population of another asset, or none, with 404 on rename and delete', async () => {
		const population = await made('Not elsewhere');
		const otherAsset = await sequelize.query<{ id: number }>(
			`SELECT a.id FROM assets a JOIN assets c ON c.organisation_id = a.organisation_id
			  WHERE c.id = ? AND a.id <> c.id ORDER BY a.id LIMIT 1`,
			{ replacements: [carParkId], type: QueryTypes.SELECT, plain: true }
		);
		const elsewhere = `/api/v1/assets/${otherAsset!.id}/populations/custom/${population.id}`;
		expect((await engineer.patchJson(elsewhere, { name: uniqueName('Moved') })).status).toBe(404);
		expect((await engineer.delete(elsewhere)).status).toBe(404);
		const none = `${customUrl()}/4000000000`;
		expect((await engineer.patchJson(none, { name: uniqueName('Ghost') })).status).toBe(404);
		expect((await engineer.delete(none)).status).toBe(404);
		expect(await populationsNamed(population.name)).toBe(1);
	});

	it.each(['owner', 'surveyor', 'researcher'] as const)(
		'refuses the %s a rename or a delete: 403, nothing changed',
		async (role) => {
			const population = await made(`Kept from ${role}`);
			const client = await signInAs(role);
			const url = `${customUrl()}/${population.id}`;
			const renamed = await client.patchJson(url, { name: uniqueName(`By ${role}`) });
			expect(renamed.status).toBe(403);
			expect((await renamed.json()).error.code).toBe('forbidden');
			const deleted = await client.delete(url);
			expect(deleted.status).toBe(403);
			expect(await populationsNamed(population.name)).toBe(1);
		}
	);
});
