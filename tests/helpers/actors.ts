import { QueryTypes, type Sequelize } from 'sequelize';
import type { Actor } from '../../src/lib/server/policy';

/** The demo person with this e-mail as a policy actor, read from the database. */
export async function demoActor(sequelize: Sequelize, email: string): Promise<Actor> {
	const row = await sequelize.query<{
		userId: number;
		organisationId: number;
		role: Actor['role'];
	}>(
		`SELECT u.id AS userId, m.organisation_id AS organisationId, m.role
		   FROM users u JOIN memberships m ON m.user_id = u.id WHERE u.email = ?`,
		{ replacements: [email], type: QueryTypes.SELECT, plain: true }
	);
	if (!row) throw new Error(`no demo user ${email}`);
	return row;
}

/** The id of a demo asset by name. */
export async function assetIdByName(sequelize: Sequelize, name: string): Promise<number> {
	const row = await sequelize.query<{ id: number }>('SELECT id FROM assets WHERE name = ?', {
		replacements: [name],
		type: QueryTypes.SELECT,
		plain: true
	});
	if (!row) throw new Error(`no demo asset ${name}`);
	return row.id;
}

/** Covers of a population straight from SQL, independent of the service's own query. */
export async function coversBySql(
	sequelize: Sequelize,
	assetId: number,
	memberType: string,
	exposureClass: string
): Promise<number[]> {
	const rows = await sequelize.query<{ c: number }>(
		`SELECT r.cover_mm AS c FROM readings r JOIN members m ON m.id = r.member_id
		  WHERE m.asset_id = ? AND m.member_type = ? AND m.exposure_class = ?`,
		{ replacements: [assetId, memberType, exposureClass], type: QueryTypes.SELECT }
	);
	return rows.map((r) => r.c);
}

export const CAR_PARK = 'Brackenfield Multi-storey Car Park';
export const FOOTBRIDGE = 'Millrace Footbridge';
export const ADMIN = 'admin@kestrel-lane.example';
export const ENGINEER = 'engineer@kestrel-lane.example';
export const SURVEYOR = 'surveyor@kestrel-lane.example';
export const OWNER = 'owner@northmoor.example';

/**
 * A fresh asset of the demo consultancy shared with nobody: the demo shares every structure with
 * its owner, so tests of "neither owned nor shared" make their own.
 */
export async function unsharedAsset(sequelize: Sequelize, tag: string): Promise<number> {
	const [id] = await sequelize.query(
		`INSERT INTO assets (organisation_id, name, design_code, unit_system, design_service_life_years,
		                     research_opt_in, created_at, updated_at)
		 SELECT organisation_id, ?, 'EN 1992-1-1', 'mm', 50, 0, NOW(), NOW()
		   FROM memberships m JOIN users u ON u.id = m.user_id WHERE u.email = ?`,
		{ replacements: [`Unshared store ${tag}`, ENGINEER], type: QueryTypes.INSERT }
	);
	return Number(id);
}
