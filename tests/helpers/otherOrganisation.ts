/**
 * A second organisation with records of its own, for the cross-organisation attacks: signed up
 * through the real form (its creator is admin), then given a copy of one demo member's asset,
 * survey, member and readings by SQL (intake's pages may not exist yet) and a verification hole,
 * and an assessment and an API token made through the API as that admin would.
 */
import { rebuildCoverCounts } from '../../src/lib/server/readings/coverSets';
import { QueryTypes, type Sequelize } from 'sequelize';
import { randomBytes } from 'node:crypto';
import { signUpNewOrganisation } from './accounts';
import type { HttpClient } from './session';
import { appUrl } from './env';

export interface OrganisationIds {
	assetId: number;
	surveyId: number;
	memberId: number;
	holeId: number;
	carbonationTestId: number;
	chlorideProfileId: number;
	assessmentId: number;
	membershipId: number;
	tokenId: number;
	exportId: number;
	batchId: number;
	attachmentId: number;
	/** A population the organisation's engineers made of its asset's member. */
	customPopulationId: number;
	/** A word that appears in the organisation's own asset name and nowhere else. */
	marker: string;
}

export interface OtherOrganisation {
	admin: HttpClient;
	ids: OrganisationIds;
}

const one = async <T extends object>(sequelize: Sequelize, sql: string, replacements: unknown[]) =>
	(await sequelize.query<T>(sql, { replacements, type: QueryTypes.SELECT, plain: true })) as T;

const insert = async (sequelize: Sequelize, sql: string, replacements: unknown[]) => {
	const [id] = await sequelize.query(sql, { replacements, type: QueryTypes.INSERT });
	return Number(id);
};

/** Copies asset → survey → first member → its readings into `organisationId`, with a hole. */
async function copyRecords(sequelize: Sequelize, organisationId: number, marker: string) {
	const assetId = await insert(
		sequelize,
		`INSERT INTO assets (organisation_id, name, location_text, description, year_of_construction,
		   design_code, unit_system, design_service_life_years, research_opt_in, created_at, updated_at)
		 SELECT ?, ?, location_text, description, year_of_construction, design_code, unit_system,
		   design_service_life_years, 0, NOW(), NOW() FROM assets WHERE id = 1`,
		[organisationId, `Hostile test asset ${marker}`]
	);
	const surveyId = await insert(
		sequelize,
		`INSERT INTO surveys (asset_id, title, survey_date, surveyor_name, meter_make, meter_serial,
		   status, created_at, updated_at)
		 SELECT ?, ?, survey_date, surveyor_name, meter_make, meter_serial, 'draft', NOW(), NOW()
		   FROM surveys WHERE id = 1`,
		[assetId, `Hostile survey ${marker}`]
	);
	const source = await one<{ id: number }>(
		sequelize,
		'SELECT id FROM members WHERE survey_id = 1 ORDER BY id LIMIT 1',
		[]
	);
	const memberId = await insert(
		sequelize,
		`INSERT INTO members (survey_id, asset_id, label, member_type, face, exposure_class,
		   requirement_source, structural_class, c_min_mm, c_nom_mm, delta_c_dev_mm, delta_plus_mm,
		   bar_diameter_mm, bar_spacing_mm, spacing_tolerance_mm, member_depth_mm, grid_width_mm,
		   grid_height_mm, notes, created_at, updated_at)
		 SELECT ?, ?, ?, member_type, face, exposure_class, requirement_source, structural_class,
		   c_min_mm, c_nom_mm, delta_c_dev_mm, delta_plus_mm, bar_diameter_mm, bar_spacing_mm,
		   spacing_tolerance_mm, member_depth_mm, grid_width_mm, grid_height_mm, notes, NOW(), NOW()
		   FROM members WHERE id = ?`,
		[surveyId, assetId, `HOSTILE-${marker}`, source.id]
	);
	await sequelize.query(
		`INSERT INTO readings (member_id, x_mm, y_mm, cover_mm, bar_diameter_mm, bar_spacing_mm,
		   bar_direction, flags, note)
		 SELECT ?, x_mm, y_mm, cover_mm, bar_diameter_mm, bar_spacing_mm, bar_direction, flags, note
		   FROM readings WHERE member_id = ?`,
		{ replacements: [memberId, source.id], type: QueryTypes.INSERT }
	);
	await sequelize.transaction((transaction) => rebuildCoverCounts(transaction, [memberId]));
	const holeId = await insert(
		sequelize,
		`INSERT INTO verification_holes (member_id, label, x_mm, y_mm, meter_reading_mm,
		   measured_cover_mm, method, created_at) VALUES (?, 'H1', 0, 0, 40, 41.5, 'drilled', NOW())`,
		[memberId]
	);
	return {
		assetId,
		surveyId,
		memberId,
		holeId,
		...(await insertMeasurements(sequelize, memberId))
	};
}

/** A carbonation test and a chloride profile (one increment) on `memberId`, by SQL. */
export async function insertMeasurements(sequelize: Sequelize, memberId: number) {
	const label = `HOSTILE-${randomBytes(4).toString('hex')}`;
	const carbonationTestId = await insert(
		sequelize,
		`INSERT INTO carbonation_tests (member_id, label, tested_on, depths_mm, depth_mean_mm, created_at)
		 VALUES (?, ?, '2026-01-10', '[]', 12, NOW())`,
		[memberId, label]
	);
	const chlorideProfileId = await insert(
		sequelize,
		`INSERT INTO chloride_profiles (member_id, label, tested_on, basis, created_at)
		 VALUES (?, ?, '2026-01-10', 'binder', NOW())`,
		[memberId, label]
	);
	await insert(
		sequelize,
		`INSERT INTO chloride_increments (profile_id, position, from_mm, to_mm, chloride_percent, outermost)
		 VALUES (?, 1, 0, 5, 1.2, 1)`,
		[chlorideProfileId]
	);
	return { carbonationTestId, chlorideProfileId };
}

/** A draft assessment of `assetId` and an API token, both made over HTTP by `client`. */
export async function draftAndToken(client: HttpClient, assetId: number) {
	// Every survey of the asset, named: a fixture's surveys may all still be drafts, which the
	// default selection (approved surveys) leaves out.
	const listed = await client.get(`/api/v1/assets/${assetId}/surveys`, {
		accept: 'application/json'
	});
	if (listed.status !== 200) throw new Error(`surveys failed: ${listed.status}`);
	const { surveys } = (await listed.json()) as { surveys: { id: number }[] };
	const saved = await client.postJson(`/api/v1/assets/${assetId}/assessments`, {
		title: 'Hostile input fixture',
		surveys: surveys.map((s) => s.id)
	});
	if (saved.status !== 201) throw new Error(`draft failed: ${saved.status} ${await saved.text()}`);
	const assessmentId = ((await saved.json()) as { assessment: { id: number } }).assessment.id;
	const made = await client.postJson('/api/v1/tokens', {
		name: 'hostile fixture',
		expiresInDays: 1
	});
	if (made.status !== 201) throw new Error(`token failed: ${made.status} ${await made.text()}`);
	const tokenId = ((await made.json()) as { token: { id: number } }).token.id;
	return { assessmentId, tokenId };
}

/** A custom population of one member of `assetId`, made over HTTP by `client`. */
export async function customPopulationOf(client: HttpClient, assetId: number, memberId: number) {
	const made = await client.postJson(`/api/v1/assets/${assetId}/populations/custom`, {
		name: `Hostile fixture ${randomBytes(4).toString('hex')}`,
		members: [memberId]
	});
	if (made.status !== 201)
		throw new Error(`population failed: ${made.status} ${await made.text()}`);
	return ((await made.json()) as { population: { id: number } }).population.id;
}

/** A research export of the client's organisation (recorded when its CSV is downloaded). */
export async function researchExportOf(client: HttpClient): Promise<number> {
	const csv = await client.get('/api/v1/research/exports/groups.csv');
	if (csv.status !== 200) throw new Error(`export failed: ${csv.status} ${await csv.text()}`);
	await csv.arrayBuffer();
	const listed = (await (await client.get('/api/v1/research/exports')).json()) as {
		exports: { id: number }[];
	};
	return listed.exports[0].id;
}

export async function createOtherOrganisation(sequelize: Sequelize): Promise<OtherOrganisation> {
	const marker = randomBytes(4).toString('hex');
	const { email, client } = await signUpNewOrganisation(`hostile-${marker}`);
	const membership = await one<{ id: number; organisationId: number }>(
		sequelize,
		`SELECT m.id, m.organisation_id AS organisationId FROM memberships m
		   JOIN users u ON u.id = m.user_id WHERE u.email = ?`,
		[email]
	);
	const records = await copyRecords(sequelize, membership.organisationId, marker);
	const made = await draftAndToken(client, records.assetId);
	const exportId = await researchExportOf(client);
	const uploads = await uploadsTo(client, records.surveyId, marker);
	const customPopulationId = await customPopulationOf(client, records.assetId, records.memberId);
	return {
		admin: client,
		ids: {
			...records,
			...made,
			...uploads,
			exportId,
			customPopulationId,
			membershipId: membership.id,
			marker
		}
	};
}

/** A reading file staged for import and an attachment, uploaded to a draft survey over HTTP. */
export async function uploadsTo(client: HttpClient, surveyId: number, marker: string) {
	const raw = (path: string, body: string, type: string) =>
		fetch(new URL(path, appUrl()), {
			method: 'POST',
			body,
			headers: { cookie: client.cookie, 'content-type': type, origin: new URL(appUrl()).origin }
		});
	const file = `Member,X (mm),Y (mm),Cover (mm)\r\nHOSTILE-${marker},0,0,41.5\r\n`;
	const staged = await raw(`/api/v1/surveys/${surveyId}/imports?fileName=r.csv`, file, 'text/csv');
	if (staged.status !== 201)
		throw new Error(`upload failed: ${staged.status} ${await staged.text()}`);
	const { batchId } = (await staged.json()) as { batchId: number };
	const attached = await raw(
		`/api/v1/surveys/${surveyId}/attachments?fileName=note.txt&kind=other`,
		'a note',
		'text/plain'
	);
	if (attached.status !== 201)
		throw new Error(`attach failed: ${attached.status} ${await attached.text()}`);
	const attachmentId = ((await attached.json()) as { attachment: { id: number } }).attachment.id;
	return { batchId, attachmentId };
}
