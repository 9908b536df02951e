import { rebuildCoverCounts } from '../../src/lib/server/readings/coverSets';
import { QueryTypes, type Sequelize } from 'sequelize';
import { createApiToken } from '../../src/lib/server/auth/apiTokens';
import {
	Asset,
	Member,
	Membership,
	Organisation,
	Survey,
	User
} from '../../src/lib/server/db/models';

/**
 * The export benchmark's data: one opted-in asset with MEMBERS members and `readings` readings
 * in all, made inside MariaDB by its sequence engine (seq_1_to_N), and a researcher's token.
 */
const MEMBERS = 100;

export async function loadBenchData(sequelize: Sequelize, readings: number): Promise<string> {
	const owner = await Organisation.create({ name: 'Bench owner', slug: 'bench-owner' });
	const research = await Organisation.create({ name: 'Bench research', slug: 'bench-research' });
	const user = await User.create({
		email: 'bench@research.example',
		displayName: 'Bench researcher',
		passwordHash: 'not-used',
		activeOrganisationId: research.id
	});
	await Membership.create({ userId: user.id, organisationId: research.id, role: 'researcher' });
	const asset = await Asset.create({
		organisationId: owner.id,
		name: 'Bench asset',
		locationText: null,
		yearOfConstruction: 1994,
		designCode: 'EN 1992-1-1',
		designServiceLifeYears: 50,
		researchOptIn: true
	});
	const survey = await Survey.create({
		assetId: asset.id,
		title: 'Bench survey',
		surveyDate: '2025-01-01',
		surveyorUserId: null,
		surveyorName: null,
		meterMake: null,
		meterSerial: null,
		meterCalibration: null,
		status: 'submitted'
	});
	const members = await Member.bulkCreate(
		Array.from({ length: MEMBERS }, (_, i) => ({
			surveyId: survey.id,
			assetId: asset.id,
			label: `M${i}`,
			memberType: i % 2 ? ('slab' as const) : ('beam' as const),
			face: 'bottom' as const,
			exposureClass: i % 3 ? 'XC3' : 'XC4',
			requirementSource: 'EN 1992-1-1' as const,
			structuralClass: 'S4',
			cMinMm: 25,
			cNomMm: 35,
			deltaCDevMm: 10,
			deltaPlusMm: null,
			barDiameterMm: 12,
			barSpacingMm: null,
			spacingToleranceMm: null,
			memberDepthMm: 250,
			gridWidthMm: 5000,
			gridHeightMm: 5000
		}))
	);
	const firstMemberId = Math.min(...members.map((m) => m.id));
	await sequelize.query(
		`INSERT INTO readings (member_id, x_mm, y_mm, cover_mm, bar_diameter_mm, flags)
		 SELECT :first + (seq % ${MEMBERS}), (seq % 97) * 50, (FLOOR(seq / 97) % 100) * 50,
		        20 + ((seq * 7919) % 4000) / 100, 12, 0
		   FROM seq_1_to_${readings}`,
		{ type: QueryTypes.INSERT, replacements: { first: firstMemberId } }
	);
	// Their summary rows, as an import keeps them (the statistics read these).
	await sequelize.transaction((t) =>
		rebuildCoverCounts(
			t,
			members.map((m) => m.id)
		)
	);
	const { secret } = await createApiToken({
		userId: user.id,
		organisationId: research.id,
		name: 'bench',
		expiresInDays: 1
	});
	return secret;
}
